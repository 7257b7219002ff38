/**
 * A recording's life: its states, the pipeline steps inside `processing`, and the only moves
 * between them. Pure: the recording service (src/server/services/recording-lifecycle.ts) asks
 * this table before every write to the recordings table, so no other code decides a state.
 */

/** Where a recording stands. `cancelled` is the coach's own stop, not a failure. */
export const RECORDING_STATES = ['uploading', 'processing', 'ready', 'failed', 'cancelled'] as const;
export type RecordingState = (typeof RECORDING_STATES)[number];

/** What runs now: the browser's upload, then the worker's probe, packaging and output upload. */
export const RECORDING_STEPS = ['upload', 'probe', 'package', 'upload-outputs'] as const;
export type RecordingStep = (typeof RECORDING_STEPS)[number];

/** Where the file came from: a coach's upload, or a demo recording generated for the invented scenario. */
export const RECORDING_SOURCES = ['upload', 'demo'] as const;
export type RecordingSource = (typeof RECORDING_SOURCES)[number];

/**
 * Why a recording failed, which decides whether Retry can help: `refused` means the file itself
 * cannot become a class (retrying fails the same way); `interrupted` means our side stopped
 * (a worker crash, a store outage) and running it again can succeed.
 */
export const FAILURE_KINDS = ['refused', 'interrupted'] as const;
export type FailureKind = (typeof FAILURE_KINDS)[number];

/** Shown when processing stopped on our side after every automatic attempt; Retry can help. */
export const INTERRUPTED_REASON =
  'Processing stopped because of a problem on our side (the worker or the file store), not because of your file. Press Retry to process it again.';

/** Shown when the processing server's scratch space ran out on the last automatic attempt; Retry can help once there is room. */
export const SCRATCH_FULL_REASON =
  'Processing stopped because the processing server ran out of scratch space, not because of your file. Press Retry to process it again.';

/** Shown while the queue tries a step again after an attempt failed on our side. */
export const RETRY_REASONS = {
  scratchFull: 'The last attempt stopped because the processing server ran out of scratch space (not because of your file). It will try again by itself.',
  ourSide: 'The last attempt stopped because of a problem on our side (the worker or the file store), not because of your file. It will try again by itself.',
} as const;

/** A recording's position in its life. `step` is set only while uploading or processing. */
export interface RecordingStatus {
  state: RecordingState;
  step: RecordingStep | null;
  failureKind: FailureKind | null;
}

/** Things that happen to a recording; each is one write of the recording service. */
export type RecordingEvent =
  | 'upload-finished'
  | 'upload-refused'
  | 'upload-cancelled'
  | 'upload-abandoned'
  | 'probed'
  | 'packaged'
  | 'outputs-stored'
  | 'refused'
  | 'interrupted'
  | 'retried';

type Position = `${RecordingState}` | `${RecordingState}/${RecordingStep}`;

/** The allowed moves: from which positions an event may happen, and where it leads. */
export const TRANSITIONS: Record<RecordingEvent, { from: readonly Position[]; to: RecordingStatus }> = {
  'upload-finished': { from: ['uploading/upload'], to: { state: 'processing', step: 'probe', failureKind: null } },
  // The stored object is empty or over the limit: the file is the problem.
  'upload-refused': { from: ['uploading/upload'], to: { state: 'failed', step: null, failureKind: 'refused' } },
  'upload-cancelled': { from: ['uploading/upload'], to: { state: 'cancelled', step: null, failureKind: null } },
  // Never finished within a day: there is no file to process again.
  'upload-abandoned': { from: ['uploading/upload'], to: { state: 'failed', step: null, failureKind: 'refused' } },
  probed: { from: ['processing/probe'], to: { state: 'processing', step: 'package', failureKind: null } },
  packaged: { from: ['processing/package'], to: { state: 'processing', step: 'upload-outputs', failureKind: null } },
  'outputs-stored': { from: ['processing/upload-outputs'], to: { state: 'ready', step: null, failureKind: null } },
  refused: { from: ['processing/probe', 'processing/package'], to: { state: 'failed', step: null, failureKind: 'refused' } },
  interrupted: {
    from: ['processing/probe', 'processing/package', 'processing/upload-outputs'],
    to: { state: 'failed', step: null, failureKind: 'interrupted' },
  },
  retried: { from: ['failed'], to: { state: 'processing', step: 'probe', failureKind: null } },
};

/** Raised when code asks for a move the table does not allow (a bug, or a race another write won). */
export class LifecycleError extends Error {
  constructor(
    readonly event: RecordingEvent,
    readonly from: Pick<RecordingStatus, 'state' | 'step'>,
  ) {
    super(`a recording cannot go through "${event}" while ${from.state}${from.step ? `/${from.step}` : ''}`);
    this.name = 'LifecycleError';
  }
}

const positionOf = (s: Pick<RecordingStatus, 'state' | 'step'>): Position => (s.step ? `${s.state}/${s.step}` : s.state);

/** Whether `event` may happen now. A failed recording may be retried only when Retry can help. */
export function canHappen(event: RecordingEvent, from: RecordingStatus): boolean {
  const allowed = TRANSITIONS[event].from;
  const here = positionOf(from);
  if (!allowed.includes(here) && !allowed.includes(from.state)) return false;
  if (event === 'retried') return from.failureKind === 'interrupted';
  return true;
}

/** The status after `event`, or a {@link LifecycleError} when the table does not allow it. */
export function nextStatus(from: RecordingStatus, event: RecordingEvent): RecordingStatus {
  if (!canHappen(event, from)) throw new LifecycleError(event, from);
  return { ...TRANSITIONS[event].to };
}

/** Where a new recording starts: uploads wait for the browser; demo files are already stored. */
export function initialStatus(source: RecordingSource): RecordingStatus {
  return source === 'upload'
    ? { state: 'uploading', step: 'upload', failureKind: null }
    : { state: 'processing', step: 'probe', failureKind: null };
}

/** Whether the coach is offered Retry. */
export const canRetry = (s: RecordingStatus): boolean => canHappen('retried', s);

/** The worker job that runs (or resumes) a processing step; packaging re-runs whole, output upload included. */
export type StepJob = 'recording.probe' | 'recording.package';
export function jobForStep(step: RecordingStep): StepJob | null {
  switch (step) {
    case 'probe':
      return 'recording.probe';
    case 'package':
    case 'upload-outputs':
      return 'recording.package';
    case 'upload':
      return null; // the browser's part: nothing for a worker to resume
  }
}

/**
 * Whether the worker that ran `from` carries on with `to` in the same job (packaging goes on to
 * upload its outputs): its heartbeat continues. Otherwise the new step waits in the queue.
 */
export function sameJobContinues(from: RecordingStatus, to: RecordingStatus): boolean {
  if (from.state !== 'processing' || to.state !== 'processing' || !from.step || !to.step) return false;
  return jobForStep(from.step) === jobForStep(to.step);
}

/** Parses a stored step (the column is text): anything unknown reads as no step. */
export function asStep(value: string | null): RecordingStep | null {
  return (RECORDING_STEPS as readonly string[]).includes(value ?? '') ? (value as RecordingStep) : null;
}
