/**
 * A job worker whose scratch folder (ROUNDMARK_WORK_DIR) is a size-limited tmpfs, for the
 * "scratch disk full" fault test. The tmpfs is mounted in a mount namespace of the worker's own
 * (util-linux `unshare`), so nothing else on the machine sees it and it goes away with the worker.
 * As an ordinary user, a user namespace maps us to root inside it (Debian 11+ allows that by
 * default), so no root is needed; `nsenter` into the same namespaces resizes it ("space back").
 */
import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { startWorker } from './app-server';

const run = promisify(execFile);
const asRoot = process.getuid?.() === 0;
/** Root only needs the mount namespace; anyone else first gets a user namespace where they are root. */
const NAMESPACES = asRoot ? ['--mount'] : ['--user', '--map-root-user', '--mount'];
const ENTER = asRoot ? ['-m'] : ['-U', '-m', '--preserve-credentials'];
const MOUNT_THEN_RUN = 'mount -t tmpfs -o "size=$1,mode=0700" tmpfs "$2" && shift 2 && exec "$@"';

/** Null when this machine can mount a private tmpfs without help, else the reason it cannot. */
export async function smallScratchUnsupported(): Promise<string | null> {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-scratch-probe-'));
  try {
    await run('unshare', [...NAMESPACES, 'sh', '-c', MOUNT_THEN_RUN, 'sh', '64k', dir, 'true'], { timeout: 10_000 });
    return null;
  } catch (err) {
    return `a private tmpfs cannot be mounted here (unshare ${NAMESPACES.join(' ')}: ${(err as Error).message.split('\n').slice(0, 2).join(' ')}); user namespaces may be switched off (sysctl kernel.unprivileged_userns_clone / user.max_user_namespaces) or blocked by a container's seccomp profile`;
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

export interface SmallScratchWorker {
  pid: number;
  dir: string;
  /** Gives the scratch disk a new size (in the worker's own mount namespace). */
  resize(bytes: number): Promise<void>;
}

/** Starts a worker whose scratch folder holds at most `bytes` (rounded up to whole pages by tmpfs). */
export async function startSmallScratchWorker(bytes: number): Promise<SmallScratchWorker> {
  const dir = await mkdtemp(join(tmpdir(), 'roundmark-small-scratch-'));
  const child = startWorker({ env: { ROUNDMARK_WORK_DIR: dir }, prefix: ['unshare', ...NAMESPACES, 'sh', '-c', MOUNT_THEN_RUN, 'sh', String(bytes), dir] });
  const pid = child.pid!;
  return {
    pid,
    dir,
    resize: async (size) => {
      await run('nsenter', ['-t', String(pid), ...ENTER, 'mount', '-o', `remount,size=${size}`, 'tmpfs', dir], { timeout: 10_000 });
    },
  };
}
