import { statfs } from 'node:fs/promises';
import { FfmpegError } from '../media/ffmpeg-runner';

/**
 * The worker's scratch folder (ROUNDMARK_WORK_DIR) ran full: ffmpeg or our own writes met ENOSPC
 * (or a quota). It says how much room was left, so whoever runs the worker knows what to free.
 * Its stack is only its message: the job's output in the queue should read as a reason, not a trace.
 */
export class ScratchSpaceError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ScratchSpaceError';
    this.stack = `${this.name}: ${message}`;
  }
}

// ffmpeg prints the C library's strerror text for ENOSPC and EDQUOT (glibc wording).
const FULL_TEXT = /No space left on device|Disk quota exceeded/i;
const FULL_CODES = new Set(['ENOSPC', 'EDQUOT']);

/** Whether an error (or one of its causes) means the disk under the scratch folder is full. */
export function isScratchFull(err: unknown): boolean {
  for (let e = err, depth = 0; e && depth < 5; depth++) {
    const { code, cause } = e as { code?: unknown; cause?: unknown };
    if (typeof code === 'string' && FULL_CODES.has(code)) return true;
    if (e instanceof FfmpegError && FULL_TEXT.test(e.stderrTail)) return true;
    e = cause;
  }
  return false;
}

const megabytes = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(1)} MB`;

/**
 * The clear reason for a full scratch folder, with the room left in it now. The underlying error
 * goes to the worker's log only (the queue would store its trace beside the reason).
 */
export async function scratchSpaceError(workDir: string, doing: string, cause: unknown): Promise<ScratchSpaceError> {
  console.error(`scratch folder ${workDir} full:`, cause instanceof Error ? cause.message : cause);
  const room = await statfs(workDir).catch(() => null);
  const left = room ? ` (${megabytes(room.bavail * room.bsize)} free of ${megabytes(room.blocks * room.bsize)})` : '';
  return new ScratchSpaceError(
    `Not enough scratch space to ${doing}: the worker's scratch folder ${workDir} ran full${left}. Nothing was stored; the job will be tried again.`,
  );
}
