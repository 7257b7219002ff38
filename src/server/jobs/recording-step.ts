import { markInterrupted } from '../services/recording-lifecycle';
import type { JobHandler } from './job-context';

/**
 * Wraps a recording step's handler: when its last automatic attempt throws (a worker crash, a
 * store outage), the recording is marked interrupted so the coach can retry; a worker that is
 * only stopping leaves it for the next worker instead.
 */
export function recordingStep<N extends 'recording.probe' | 'recording.package'>(handler: JobHandler<N>): JobHandler<N> {
  return async (data, ctx, attempt) => {
    try {
      return await handler(data, ctx, attempt);
    } catch (err) {
      if (attempt.last && !ctx.signal.aborted) await markInterrupted(ctx.deps, data.recordingId);
      throw err;
    }
  };
}
