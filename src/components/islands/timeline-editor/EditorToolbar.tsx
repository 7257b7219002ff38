import { Fragment, type ReactNode } from 'react';
import type { ShortcutCommand } from '~/lib/editor/shortcuts';
import type { EditorView } from './controller/use-editor-controller';
import { ZOOM_LEVELS } from './controller/editor-commands';
import { PlayButton, PlayheadTime } from './PlayControls';
import { toolButton } from './tool-button';

/** One toolbar button: runs a command of the command table. */
export interface ToolButtonSpec {
  command: ShortcutCommand;
  label: string;
  keys?: string;
  title?: string;
  ariaLabel?: string;
  disabled?(c: EditorView): boolean;
}

/**
 * The toolbar as data: groups of buttons separated by a rule. To add a tool, add a command
 * to the command table and a row here, or pass it in `extra` (rendered as its own group).
 */
export const TOOL_GROUPS: readonly (readonly ToolButtonSpec[])[] = [
  [
    { command: 'split', label: 'Split here', keys: 'S' },
    { command: 'add-cue', label: 'Add cue', keys: 'C' },
    {
      command: 'layout',
      label: 'Lay out plan from here',
      keys: 'L',
      title: "Places the plan's parts with their planned lengths, starting at the playhead",
      disabled: (c) => !c.plan,
    },
  ],
  [
    { command: 'undo', label: 'Undo', keys: 'Control+Z', disabled: (c) => c.state.past.length === 0 },
    { command: 'redo', label: 'Redo', keys: 'Control+Shift+Z', disabled: (c) => c.state.future.length === 0 },
  ],
];

const Rule = () => <span className="mx-1 hidden h-6 w-px bg-stone sm:inline-block" aria-hidden="true" />;

export default function EditorToolbar({ c, extra }: { c: EditorView; extra?: ReactNode }) {
  return (
    <div className="flex flex-wrap items-center gap-2" role="toolbar" aria-label="Timeline tools">
      <PlayButton store={c.playhead} disabled={!c.data.recording} onClick={() => c.run('play-pause')} />
      <PlayheadTime store={c.playhead} total={c.mediaSeconds} />
      {TOOL_GROUPS.map((group, i) => (
        <Fragment key={i}>
          {i > 0 && <Rule />}
          {group.map((b) => (
            <button
              key={b.command}
              type="button"
              className={toolButton}
              onClick={() => c.run(b.command)}
              disabled={b.disabled?.(c) ?? false}
              aria-keyshortcuts={b.keys}
              aria-label={b.ariaLabel}
              title={b.title}
            >
              {b.label}
            </button>
          ))}
        </Fragment>
      ))}
      {extra && (
        <>
          <Rule />
          {extra}
        </>
      )}
      <Rule />
      <ZoomControls c={c} />
      <label className="ml-1 inline-flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" checked={c.snapOn} onChange={(e) => c.setSnapOn(e.target.checked)} className="h-4 w-4 accent-ink" aria-keyshortcuts="N" />
        Snap to sounds and plan
      </label>
      <button type="button" className={toolButton} onClick={() => c.setHelpOpen((o) => !o)} aria-expanded={c.helpOpen} aria-keyshortcuts="?">Keyboard help</button>
    </div>
  );
}

function ZoomControls({ c }: { c: EditorView }) {
  return (
    <>
      <button type="button" className={toolButton} onClick={() => c.run('zoom-out')} disabled={c.zoomIndex === 0} aria-label="Zoom out">−</button>
      <span className="tabular text-sm" aria-live="polite">{c.zoomIndex === 0 ? 'Whole class' : `${ZOOM_LEVELS[c.zoomIndex]} px/s`}</span>
      <button type="button" className={toolButton} onClick={() => c.run('zoom-in')} disabled={c.zoomIndex === ZOOM_LEVELS.length - 1} aria-label="Zoom in">+</button>
    </>
  );
}
