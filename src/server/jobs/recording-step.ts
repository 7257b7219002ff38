import { RETRY_REASONS, SCRATCH_FULL_REASON } from '~/lib/media/recording-lifecycle';
import { markInterrupted, noteRetry } from '../services/recording-lifecycle';
import type { JobHandler } from './job-context';
import { isScratchFull, scratchSpaceError, ScratchSpaceError } from './scratch-space';

const DOING: Record<'recording.probe' | 'recording.package', string> = {
  'recording.probe': 'read the uploaded file',
  'recording.package': 'package the recording',
};

/**
 * Wraps a recording step's handler. When an attempt throws (a worker crash, a store outage, a
 * full scratch disk), the recording says why while the queue tries again; when the last automatic
 * attempt throws, it is marked interrupted so the coach can retry. A worker that is only stopping
 * leaves it for the next worker instead.
 */
export function recordingStep<N extends 'recording.probe' | 'recording.package'>(name: N, handler: JobHandler<N>): JobHandler<N> {
  return async (data, ctx, attempt) => {
    try {
      return await handler(data, ctx, attempt);
    } catch (err) {
      const problem = isScratchFull(err) ? await scratchSpaceError(ctx.workDir, DOING[name], err) : err;
      if (ctx.signal.aborted) throw problem;
      const scratch = problem instanceof ScratchSpaceError;
      if (attempt.last) await markInterrupted(ctx.deps, data.recordingId, scratch ? SCRATCH_FULL_REASON : undefined);
      // The attempt's own error is what the queue must record, even when the note cannot be written (database away).
      else await noteRetry(ctx.deps, data.recordingId, scratch ? RETRY_REASONS.scratchFull : RETRY_REASONS.ourSide).catch((e: unknown) => console.error('retry note not written:', e));
      throw problem;
    }
  };
}
