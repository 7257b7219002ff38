/**
 * The one module that writes the recordings table. Every state change goes through the pure
 * lifecycle table (src/lib/media/recording-lifecycle.ts) and is applied with a conditional
 * update on the state it was decided from, so two writers racing cannot both win.
 */
import { and, eq, inArray, isNotNull, isNull, lt, or, sql } from 'drizzle-orm';
import { lessons, recordings } from '~/db/schema';
import {
  asStep,
  canHappen,
  INTERRUPTED_REASON,
  initialStatus,
  jobForStep,
  nextStatus,
  sameJobContinues,
  type RecordingEvent,
  type RecordingSource,
  type RecordingStatus,
  type RecordingStep,
  type StepJob,
} from '~/lib/media/recording-lifecycle';
import type { AppDeps } from '../app';
import type { Db } from '../db';

export type RecordingRow = typeof recordings.$inferSelect;

/** Columns a state change may fill in besides state, step and failure (facts, outputs, reasons). */
export type RecordingFacts = Partial<
  Pick<
    RecordingRow,
    | 'sizeBytes'
    | 'failureReason'
    | 'warnings'
    | 'durationSeconds'
    | 'containerSeconds'
    | 'width'
    | 'height'
    | 'frameRate'
    | 'hasAudio'
    | 'colorTransfer'
    | 'loudnessLufs'
    | 'outputPrefix'
    | 'renditions'
    | 'peaksRate'
  >
>;

/** The lifecycle status of a stored row. */
export const statusOf = (r: Pick<RecordingRow, 'state' | 'step' | 'failureKind'>): RecordingStatus => ({
  state: r.state,
  step: asStep(r.step),
  failureKind: r.failureKind,
});

/** The row as it is now, or null when it is gone. */
export async function loadRecording(deps: AppDeps, recordingId: string): Promise<RecordingRow | null> {
  const [row] = await deps.db.select().from(recordings).where(eq(recordings.id, recordingId));
  return row ?? null;
}

/** Values of a new recording; the lifecycle decides where it starts. */
export interface NewRecording {
  id: string;
  studioId: string;
  lessonId: string;
  createdBy: string | null;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sourceKey: string;
  source: RecordingSource;
}

/** Adds a recording: an upload waits for the browser, a demo file is already stored and waits for its probe. */
export async function insertRecording(deps: AppDeps, values: NewRecording): Promise<RecordingRow> {
  const start = initialStatus(values.source);
  const [row] = await deps.db
    .insert(recordings)
    .values({ ...values, state: start.state, step: start.step, progress: 0 })
    .returning();
  return row!;
}

/** Binds the store's multipart upload id on first use; false when the upload is no longer open. */
export async function bindUploadId(deps: AppDeps, recordingId: string, uploadId: string): Promise<boolean> {
  const bound = await deps.db
    .update(recordings)
    .set({ uploadId, updatedAt: new Date() })
    .where(and(eq(recordings.id, recordingId), eq(recordings.state, 'uploading'), isNull(recordings.uploadId)))
    .returning({ id: recordings.id });
  return bound.length > 0;
}

/** Forgets an upload id once its multipart upload was aborted (a cancelled upload's clean-up). */
export async function forgetUploadId(deps: AppDeps, recordingId: string): Promise<void> {
  await deps.db.update(recordings).set({ uploadId: null }).where(eq(recordings.id, recordingId));
}

/**
 * Applies one lifecycle event with the facts it brings. Throws a LifecycleError when the table
 * forbids it; returns false when another write changed the row first (the caller then re-reads).
 */
export async function applyEvent(deps: AppDeps, row: RecordingRow, event: RecordingEvent, facts: RecordingFacts = {}): Promise<boolean> {
  return applyEventWith(deps.db, row, event, facts);
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

async function applyEventWith(db: Db | Tx, row: RecordingRow, event: RecordingEvent, facts: RecordingFacts): Promise<boolean> {
  const from = statusOf(row);
  const to = nextStatus(from, event);
  const now = new Date();
  const changed = await db
    .update(recordings)
    .set({
      ...facts,
      state: to.state,
      step: to.step,
      failureKind: to.failureKind,
      ...(to.state === 'failed' ? {} : { failureReason: facts.failureReason ?? null }),
      retryReason: null,
      progress: to.state === 'ready' ? 100 : to.step === 'upload-outputs' ? 95 : 0,
      // A step handed to the queue has no heartbeat until a worker picks it up.
      heartbeatAt: sameJobContinues(from, to) ? now : null,
      ...(to.state === 'ready' ? { readyAt: now } : {}),
      updatedAt: now,
    })
    .where(and(eq(recordings.id, row.id), eq(recordings.state, from.state), from.step ? eq(recordings.step, from.step) : isNull(recordings.step)))
    .returning({ id: recordings.id });
  return changed.length > 0;
}

/**
 * The last step of packaging: the recording becomes ready and, in the same transaction, the
 * class's current recording unless a newer one already is (members see no gap).
 */
export async function markReady(deps: AppDeps, row: RecordingRow, facts: RecordingFacts & { durationSeconds: number }): Promise<boolean> {
  return deps.db.transaction(async (tx) => {
    const applied = await applyEventWith(tx, row, 'outputs-stored', facts);
    if (!applied) return false;
    // An older recording finishing late does not push out a newer current one.
    await tx
      .update(lessons)
      .set({ currentRecordingId: row.id, mediaSeconds: facts.durationSeconds, updatedAt: new Date() })
      .where(
        and(
          eq(lessons.id, row.lessonId),
          or(isNull(lessons.currentRecordingId), lt(sql`(select created_at from recordings where id = ${lessons.currentRecordingId})`, row.createdAt)),
        ),
      );
    return true;
  });
}

/**
 * Records progress of the running step; the write doubles as the worker's heartbeat. Only the
 * step that is running may report, so a late report cannot move a recording back.
 */
export async function reportProgress(deps: AppDeps, recordingId: string, step: RecordingStep, percent: number): Promise<void> {
  const now = new Date();
  await deps.db
    .update(recordings)
    .set({ progress: Math.round(percent * 10) / 10, heartbeatAt: now, updatedAt: now })
    .where(and(eq(recordings.id, recordingId), eq(recordings.state, 'processing'), eq(recordings.step, step)));
}

/**
 * Keeps a running step's heartbeat going on a timer, independent of ffmpeg's progress lines: a
 * worker busy decoding peaks or uploading outputs is alive even though no percent moves.
 * Returns the function that stops it.
 */
export function startHeartbeat(deps: AppDeps, recordingId: string, steps: readonly RecordingStep[], everySeconds: number): () => void {
  const beat = () =>
    deps.db
      .update(recordings)
      .set({ heartbeatAt: new Date() })
      .where(and(eq(recordings.id, recordingId), eq(recordings.state, 'processing'), inArray(recordings.step, [...steps])))
      .catch((err: unknown) => console.error(`heartbeat of ${recordingId} failed:`, err));
  void beat();
  const timer = setInterval(() => void beat(), everySeconds * 1000);
  return () => clearInterval(timer);
}

/** The queue as recovery needs it (the worker passes pg-boss). */
export interface RecoveryQueue {
  /** Whether a job for this recording waits in the queue or runs. */
  hasPending(job: StepJob, recordingId: string): Promise<boolean>;
  send(job: StepJob, recordingId: string, key: string): Promise<void>;
}

/** One recovered step, for the worker's log. */
export interface RecoveredStep {
  recordingId: string;
  step: RecordingStep;
  job: StepJob;
  why: 'worker-silent' | 'job-lost';
}

/**
 * Queues again the steps that lost their worker: a running step whose heartbeat is older than
 * `staleSeconds` (its worker died), or a waiting step with no job left in the queue (the queueing
 * was lost). Each is claimed with a conditional update first, so two workers sweeping at once
 * recover it once, and a step that is re-queued waits (no heartbeat) until a worker picks it up:
 * a step that is still running or still waiting its turn is never queued twice.
 */
export async function recoverLostSteps(deps: AppDeps, staleSeconds: number, queue: RecoveryQueue): Promise<RecoveredStep[]> {
  const now = new Date();
  const cutoff = new Date(now.getTime() - staleSeconds * 1000);
  const recovered: RecoveredStep[] = [];
  const silent = await deps.db
    .update(recordings)
    .set({ heartbeatAt: null, updatedAt: now })
    .where(and(eq(recordings.state, 'processing'), isNotNull(recordings.heartbeatAt), lt(recordings.heartbeatAt, cutoff)))
    .returning({ id: recordings.id, step: recordings.step });
  for (const r of silent) {
    const step = asStep(r.step);
    const job = step ? jobForStep(step) : null;
    if (step && job) recovered.push({ recordingId: r.id, step, job, why: 'worker-silent' });
  }
  const waiting = await deps.db
    .select({ id: recordings.id, step: recordings.step, updatedAt: recordings.updatedAt })
    .from(recordings)
    .where(and(eq(recordings.state, 'processing'), isNull(recordings.heartbeatAt), lt(recordings.updatedAt, cutoff)));
  for (const r of waiting) {
    const step = asStep(r.step);
    const job = step ? jobForStep(step) : null;
    if (!step || !job || (await queue.hasPending(job, r.id))) continue;
    const claimed = await deps.db
      .update(recordings)
      .set({ updatedAt: now })
      .where(and(eq(recordings.id, r.id), eq(recordings.updatedAt, r.updatedAt), isNull(recordings.heartbeatAt)))
      .returning({ id: recordings.id });
    if (claimed.length) recovered.push({ recordingId: r.id, step, job, why: 'job-lost' });
  }
  for (const r of recovered) await queue.send(r.job, r.recordingId, `${r.job}:${r.recordingId}:recover:${now.getTime()}`);
  return recovered;
}

/**
 * Records that processing stopped on our side after the queue's last attempt (a worker crash, a
 * store outage): the coach is offered Retry, which can help here.
 */
export async function markInterrupted(deps: AppDeps, recordingId: string, reason = INTERRUPTED_REASON): Promise<void> {
  const row = await loadRecording(deps, recordingId);
  if (row && canHappen('interrupted', statusOf(row))) await applyEvent(deps, row, 'interrupted', { failureReason: reason });
}

/**
 * Says on a processing recording why its last attempt failed while the queue tries again (the
 * coach sees it under the progress); the next state change clears it. The step now waits for its
 * retry in the queue, so it has no heartbeat: recovery must not take the failed attempt for a
 * dead worker and queue a second job beside the queue's own retry.
 */
export async function noteRetry(deps: AppDeps, recordingId: string, reason: string): Promise<void> {
  await deps.db
    .update(recordings)
    .set({ retryReason: reason, heartbeatAt: null, updatedAt: new Date() })
    .where(and(eq(recordings.id, recordingId), eq(recordings.state, 'processing')));
}

/** Uploads still open and untouched since `before` (abandoned by their browser). */
export function openUploadsBefore(deps: AppDeps, before: Date): Promise<RecordingRow[]> {
  return deps.db
    .select()
    .from(recordings)
    .where(and(eq(recordings.state, 'uploading'), lt(recordings.updatedAt, before)));
}

/** Cancelled uploads whose multipart upload may still hold parts in the store. */
export function cancelledWithOpenUpload(deps: AppDeps): Promise<RecordingRow[]> {
  return deps.db
    .select()
    .from(recordings)
    .where(and(eq(recordings.state, 'cancelled'), isNotNull(recordings.uploadId)));
}
