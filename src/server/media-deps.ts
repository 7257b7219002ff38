import { app } from './app';
import { env } from './env';
import { queue, sendJob } from './queue';
import { storage } from './storage';
import type { MediaDeps } from './services/recordings';

let shared: MediaDeps | undefined;

/** The web server's media dependencies: storage, the size limit and the job queue (send only). */
export function mediaDeps(): MediaDeps {
  if (!shared) {
    const { s3, bucket } = storage();
    shared = {
      ...app(),
      s3,
      bucket,
      maxUploadBytes: env().MAX_UPLOAD_BYTES,
      enqueue: async (name, recordingId) => {
        await sendJob(await queue(env().DATABASE_URL), name, { recordingId }, `${name}:${recordingId}`);
      },
    };
  }
  return shared;
}
