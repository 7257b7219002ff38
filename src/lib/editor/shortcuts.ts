/**
 * The editor's keyboard map: one table drives both the key handler and the help panel, so
 * what the panel lists is exactly what the keys do. Fixed keys (no remapping).
 */
export type ShortcutCommand =
  | 'play-pause'
  | 'split'
  | 'kind'
  | 'exercise'
  | 'nudge-small-back'
  | 'nudge-small-forward'
  | 'nudge-large-back'
  | 'nudge-large-forward'
  | 'move-small-back'
  | 'move-small-forward'
  | 'move-large-back'
  | 'move-large-forward'
  | 'previous-boundary'
  | 'next-boundary'
  | 'add-cue'
  | 'delete'
  | 'undo'
  | 'redo'
  | 'layout'
  | 'next-uncertain'
  | 'toggle-snap'
  | 'zoom-in'
  | 'zoom-out'
  | 'save'
  | 'help';

export interface Shortcut {
  command: ShortcutCommand;
  /** Keys as shown in the help panel. */
  keys: string;
  description: string;
}

export const SHORTCUTS: readonly Shortcut[] = [
  { command: 'play-pause', keys: 'Space or K', description: 'Play or pause the recording' },
  { command: 'split', keys: 'S', description: 'Split at the playhead (a new boundary)' },
  { command: 'kind', keys: '1 – 8', description: 'Set the kind: 1 work, 2 rest, 3 round break, 4 warm-up, 5 cool-down, 6 talk, 7 intro, 8 outro' },
  { command: 'exercise', keys: 'E', description: 'Type the exercise of the selected segment' },
  { command: 'nudge-small-back', keys: '←', description: 'Nudge the selected boundary or cue 0.1 s earlier' },
  { command: 'nudge-small-forward', keys: '→', description: 'Nudge the selected boundary or cue 0.1 s later' },
  { command: 'nudge-large-back', keys: 'Shift + ←', description: 'Nudge 1 s earlier' },
  { command: 'nudge-large-forward', keys: 'Shift + →', description: 'Nudge 1 s later' },
  { command: 'move-small-back', keys: 'Ctrl + ← (⌘ + ← on a Mac)', description: 'Move the whole selected segment 0.1 s earlier (both edges; a neighbour sharing an edge follows)' },
  { command: 'move-small-forward', keys: 'Ctrl + → (⌘ + → on a Mac)', description: 'Move the whole selected segment 0.1 s later' },
  { command: 'move-large-back', keys: 'Ctrl + Shift + ←', description: 'Move the whole selected segment 1 s earlier' },
  { command: 'move-large-forward', keys: 'Ctrl + Shift + →', description: 'Move the whole selected segment 1 s later' },
  { command: 'previous-boundary', keys: '[', description: 'Jump to the previous boundary and select it' },
  { command: 'next-boundary', keys: ']', description: 'Jump to the next boundary and select it' },
  { command: 'add-cue', keys: 'C', description: 'Add a cue at the playhead' },
  { command: 'delete', keys: 'Delete or Backspace', description: 'Delete the selected segment or cue; with a boundary selected, join the two segments' },
  { command: 'undo', keys: 'Ctrl + Z', description: 'Undo (as far back as this session goes)' },
  { command: 'redo', keys: 'Ctrl + Shift + Z or Ctrl + Y', description: 'Redo' },
  { command: 'layout', keys: 'L', description: 'Lay out the plan from the playhead' },
  { command: 'next-uncertain', keys: 'U', description: 'With a "Mark it for me" proposal open: play 3 s around the next uncertain boundary' },
  { command: 'toggle-snap', keys: 'N', description: 'Snapping on or off (hold Alt while dragging to place freely)' },
  { command: 'zoom-in', keys: '+', description: 'Zoom in' },
  { command: 'zoom-out', keys: '−', description: 'Zoom out' },
  { command: 'save', keys: 'Ctrl + S', description: 'Save the timeline' },
  { command: 'help', keys: '?', description: 'Show or hide this list' },
];

export interface KeyInput {
  key: string;
  shiftKey: boolean;
  ctrlKey: boolean;
  metaKey: boolean;
  altKey: boolean;
}

/** The command a key press means, or null. `kind` carries the digit's index (0-based). */
export function commandForKey(e: KeyInput): { command: ShortcutCommand; index?: number } | null {
  const mod = e.ctrlKey || e.metaKey;
  const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
  if (mod) {
    if (key === 'z') return { command: e.shiftKey ? 'redo' : 'undo' };
    if (key === 'y') return { command: 'redo' };
    if (key === 's') return { command: 'save' };
    if (key === 'ArrowLeft') return { command: e.shiftKey ? 'move-large-back' : 'move-small-back' };
    if (key === 'ArrowRight') return { command: e.shiftKey ? 'move-large-forward' : 'move-small-forward' };
    return null;
  }
  if (e.altKey) return null;
  switch (key) {
    case ' ':
    case 'k':
      return { command: 'play-pause' };
    case 's':
      return { command: 'split' };
    case 'e':
      return { command: 'exercise' };
    case 'ArrowLeft':
      return { command: e.shiftKey ? 'nudge-large-back' : 'nudge-small-back' };
    case 'ArrowRight':
      return { command: e.shiftKey ? 'nudge-large-forward' : 'nudge-small-forward' };
    case '[':
      return { command: 'previous-boundary' };
    case ']':
      return { command: 'next-boundary' };
    case 'c':
      return { command: 'add-cue' };
    case 'Delete':
    case 'Backspace':
      return { command: 'delete' };
    case 'l':
      return { command: 'layout' };
    case 'u':
      return { command: 'next-uncertain' };
    case 'n':
      return { command: 'toggle-snap' };
    case '+':
    case '=':
      return { command: 'zoom-in' };
    case '-':
    case '_':
      return { command: 'zoom-out' };
    case '?':
      return { command: 'help' };
  }
  if (/^[1-8]$/.test(key)) return { command: 'kind', index: Number(key) - 1 };
  return null;
}
