import { useId, useState } from 'react';
import { SEGMENT_KIND_LABELS, SEGMENT_KIND_ORDER } from '~/lib/editor/segment-style';
import type { SegmentKind } from '~/lib/timeline/timeline-schema';
import type { EditorView } from './controller/use-editor-controller';
import { toolButton } from './tool-button';

/** How long an inserted segment is at first (drag its edges to fit); a plain starting value. */
export const INSERT_SECONDS = 30;

/** Inserts a segment of any kind at the playhead, over whatever is marked there (undoable). */
export default function InsertSegmentTool({ c }: { c: EditorView }) {
  const [kind, setKind] = useState<SegmentKind>('work');
  const id = useId();
  const insert = () => {
    const at = c.playhead.get();
    const end = Math.min(c.mediaSeconds, at + INSERT_SECONDS);
    c.dispatch({
      type: 'insert-segment',
      segment: { kind, startSeconds: at, endSeconds: end },
      notice: `${SEGMENT_KIND_LABELS[kind]} inserted at the playhead. Drag its edges to fit; Undo takes it back.`,
    });
  };
  return (
    <span className="inline-flex items-center gap-1">
      <label htmlFor={id} className="sr-only">Kind to insert</label>
      <select id={id} value={kind} onChange={(e) => setKind(e.target.value as SegmentKind)} className="rounded-[10px] border border-ink/70 bg-chalk px-2 py-2 text-sm font-semibold">
        {SEGMENT_KIND_ORDER.map((k) => <option key={k} value={k}>{SEGMENT_KIND_LABELS[k]}</option>)}
      </select>
      <button type="button" className={toolButton} onClick={insert} title={`Inserts a ${INSERT_SECONDS} s segment of this kind at the playhead`}>
        Insert here
      </button>
    </span>
  );
}
