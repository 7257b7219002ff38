/**
 * The editor's commands as data: one handler per command of the keyboard map
 * (`~/lib/editor/shortcuts`). Keys, toolbar buttons and menus all run commands through this
 * table, so a command behaves the same whichever way it is given.
 */
import type { Dispatch, RefObject } from 'react';
import type { Plan } from '~/lib/plan/plan-schema';
import { boundaries, segmentAt, type EditorAction, type EditorState } from '~/lib/editor/editor-state';
import type { ShortcutCommand } from '~/lib/editor/shortcuts';
import { SEGMENT_KIND_ORDER } from '~/lib/editor/segment-style';
import type { PlayheadStore } from '../playhead-store';
import type { MediaTimelineHandle } from '../MediaTimeline';

export const ZOOM_LEVELS = [0, 2, 5, 10, 20, 50, 100, 200];

/** Everything a command may touch; built once per render by the controller. */
export interface CommandContext {
  state(): EditorState;
  dispatch: Dispatch<EditorAction>;
  playhead: PlayheadStore;
  media: RefObject<MediaTimelineHandle | null>;
  plan: Plan | null;
  hasRecording: boolean;
  /** The time snapped to sounds and plan (unless `bypass`, Alt held). */
  snapPoint(t: number, bypass: boolean): number;
  setSnapOn(update: (on: boolean) => boolean): void;
  setZoomIndex(update: (i: number) => number): void;
  setHelpOpen(update: (open: boolean) => boolean): void;
  focusExercise(): void;
  save(): void;
  /** Plays around the next uncertain boundary of an open "Mark it for me" proposal (no-op without one). */
  nextUncertain(): void;
}

export interface CommandArgs {
  /** For `kind`: which kind (0-based index into SEGMENT_KIND_ORDER). */
  index?: number;
  /** Alt held: place freely, without snapping. */
  bypass: boolean;
}

type Handler = (c: CommandContext, args: CommandArgs) => void;

/** The segment a command acts on: the selected one, else the one under the playhead. */
function targetSegmentId(c: CommandContext): string | undefined {
  const s = c.state();
  if (s.selection?.type === 'segment') return s.selection.id;
  return segmentAt(s.timeline, c.playhead.get())?.id;
}

function selectSegment(c: CommandContext, id: string) {
  if (c.state().selection?.type !== 'segment') c.dispatch({ type: 'select', selection: { type: 'segment', id, edge: null } });
}

const nudge = (delta: number): Handler => (c) => c.dispatch({ type: 'nudge', delta });
const moveBy = (delta: number): Handler => (c) => c.dispatch({ type: 'move-segment', delta });

const jumpBoundary = (direction: 1 | -1): Handler => (c) => {
  const t = c.playhead.get();
  const list = boundaries(c.state().timeline);
  const target = direction > 0 ? list.find((b) => b > t + 0.0005) : [...list].reverse().find((b) => b < t - 0.0005);
  c.dispatch({ type: 'select-boundary', from: t, direction });
  if (target !== undefined) c.media.current?.seek(target);
};

export const EDITOR_COMMANDS: Record<ShortcutCommand, Handler> = {
  'next-uncertain': (c) => c.nextUncertain(),
  'play-pause': (c) => {
    if (!c.hasRecording) c.dispatch({ type: 'select', selection: c.state().selection });
    c.media.current?.playPause();
  },
  split: (c, { bypass }) => c.dispatch({ type: 'split', at: c.snapPoint(c.playhead.get(), bypass) }),
  kind: (c, { index }) => {
    const kind = SEGMENT_KIND_ORDER[index ?? 0];
    const id = targetSegmentId(c);
    if (!kind || !id) return;
    selectSegment(c, id);
    c.dispatch({ type: 'set-kind', kind, segmentId: id });
  },
  exercise: (c) => {
    const id = targetSegmentId(c);
    if (!id) return;
    selectSegment(c, id);
    c.focusExercise();
  },
  'nudge-small-back': nudge(-0.1),
  'nudge-small-forward': nudge(0.1),
  'nudge-large-back': nudge(-1),
  'nudge-large-forward': nudge(1),
  'move-small-back': moveBy(-0.1),
  'move-small-forward': moveBy(0.1),
  'move-large-back': moveBy(-1),
  'move-large-forward': moveBy(1),
  'previous-boundary': jumpBoundary(-1),
  'next-boundary': jumpBoundary(1),
  'add-cue': (c, { bypass }) => c.dispatch({ type: 'add-cue', at: c.snapPoint(c.playhead.get(), bypass) }),
  delete: (c) => c.dispatch({ type: 'delete' }),
  undo: (c) => c.dispatch({ type: 'undo' }),
  redo: (c) => c.dispatch({ type: 'redo' }),
  layout: (c, { bypass }) => {
    if (c.plan) c.dispatch({ type: 'layout-from-plan', plan: c.plan, at: c.snapPoint(c.playhead.get(), bypass) });
  },
  'toggle-snap': (c) => c.setSnapOn((on) => !on),
  'zoom-in': (c) => c.setZoomIndex((i) => Math.min(ZOOM_LEVELS.length - 1, i + 1)),
  'zoom-out': (c) => c.setZoomIndex((i) => Math.max(0, i - 1)),
  save: (c) => c.save(),
  help: (c) => c.setHelpOpen((open) => !open),
};

export function runCommand(c: CommandContext, command: ShortcutCommand, args: CommandArgs = { bypass: false }) {
  EDITOR_COMMANDS[command](c, args);
}
