import { memo } from 'react';
import type { Cue, Segment } from '~/lib/timeline/timeline-schema';
import type { Selection } from '~/lib/editor/editor-state';
import { CUE_KIND_LABELS, KIND_COLOURS, SEGMENT_KIND_PATTERNS } from '~/lib/editor/segment-style';
import { describeSegment } from '~/lib/editor/timeline-diff';
import { formatEditorTime } from '~/lib/time/format-time';

interface RowProps {
  segment: Segment;
  selected: boolean;
  onPick(id: string): void;
}

const SegmentRow = memo(function SegmentRow({ segment, selected, onPick }: RowProps) {
  const pattern = SEGMENT_KIND_PATTERNS[segment.kind];
  return (
    <li>
      <button
        type="button"
        aria-pressed={selected}
        onClick={() => onPick(segment.id)}
        className="flex w-full items-center gap-2 rounded-[4px] px-2 py-1 text-left text-sm hover:bg-paper aria-pressed:bg-ink aria-pressed:text-paper"
        data-segment-id={segment.id}
      >
        <span aria-hidden="true" className="inline-block h-3.5 w-6 shrink-0 rounded-[4px]" style={{ backgroundColor: KIND_COLOURS[segment.kind], backgroundImage: pattern.image, backgroundSize: pattern.size }} />
        <span className="tabular">{describeSegment(segment)}</span>
      </button>
    </li>
  );
});

const CueRow = memo(function CueRow({ cue, selected, onPick }: { cue: Cue; selected: boolean; onPick(id: string): void }) {
  return (
    <li>
      <button
        type="button"
        aria-pressed={selected}
        onClick={() => onPick(cue.id)}
        className="flex w-full items-center gap-2 rounded-[4px] px-2 py-1 text-left text-sm hover:bg-paper aria-pressed:bg-ink aria-pressed:text-paper"
        data-cue-id={cue.id}
      >
        <span aria-hidden="true" className="inline-block h-3 w-3 shrink-0 rounded-full bg-mint" />
        <span className="tabular">{formatEditorTime(cue.atSeconds)}</span>
        <span className="font-semibold">{CUE_KIND_LABELS[cue.kind]}</span>
        <span className="truncate">{cue.text}</span>
      </button>
    </li>
  );
});

export interface SegmentListProps {
  segments: readonly Segment[];
  cues: readonly Cue[];
  selection: Selection;
  onPickSegment(id: string): void;
  onPickCue(id: string): void;
}

/** Every segment and cue as a button: the keyboard and screen-reader way into the timeline. */
function SegmentList({ segments, cues, selection, onPickSegment, onPickCue }: SegmentListProps) {
  return (
    <details className="rounded-[10px] border border-stone/70 p-4" data-segment-list>
      <summary className="cursor-pointer font-bold">
        All marks: {segments.length} {segments.length === 1 ? 'segment' : 'segments'}, {cues.length} {cues.length === 1 ? 'cue' : 'cues'}
      </summary>
      <div className="mt-3 grid gap-4 md:grid-cols-2">
        <div>
          <h4 className="mb-1 font-bold">Segments</h4>
          <ul className="max-h-72 overflow-y-auto" aria-label="Segments">
            {segments.map((s) => (
              <SegmentRow key={s.id} segment={s} selected={selection?.type === 'segment' && selection.id === s.id} onPick={onPickSegment} />
            ))}
          </ul>
        </div>
        <div>
          <h4 className="mb-1 font-bold">Cues</h4>
          <ul className="max-h-72 overflow-y-auto" aria-label="Cues">
            {cues.map((c) => (
              <CueRow key={c.id} cue={c} selected={selection?.type === 'cue' && selection.id === c.id} onPick={onPickCue} />
            ))}
          </ul>
        </div>
      </div>
    </details>
  );
}

export default memo(SegmentList);
