import PgBoss from 'pg-boss';

/**
 * Job names and their payloads. Each name has exactly one handler in src/server/jobs/; the
 * worker refuses to start when a name has none.
 */
export interface JobPayloads {
  'recording.probe': { recordingId: string };
  'recording.package': { recordingId: string };
  'recording.audio-events': { recordingId: string };
  'uploads.cleanup': Record<string, never>;
  'lessons.publish-due': Record<string, never>;
  'version.thumbnails': { versionId: string };
  /** A cover picture from one moment of a class's recording ("Use this frame as cover"). */
  'cover.frame': { frameId: string };
  'mail.class-published': { versionId: string };
  'mail.trial-reminders': Record<string, never>;
  /** The first "confirm your address" link of a new account. */
  'mail.verify-email': { userId: string };
  /** Someone tried to sign up with an address that has an account: its owner hears about it. */
  'mail.sign-up-attempt': { email: string; /** Where the mail's sign-in link leads afterwards (a studio start: /start). */ signInPath?: string };
  /** A "forgot password" request: the lookup and the link happen here, never in the request. */
  'mail.password-reset': { email: string };
  /** A class was marked ready for review: its coaches and owner hear about it (the time names the hand-off). */
  'mail.review-requested': { lessonId: string; requestedAt: string };
  /** A coach or the owner sent a class back: whoever prepared it hears why. */
  'mail.review-sent-back': { lessonId: string; userId: string; sentBy: string; note: string; sentAt: string };
}
export type JobName = keyof JobPayloads;
export const JOB_NAMES: JobName[] = [
  'recording.probe',
  'recording.package',
  'recording.audio-events',
  'uploads.cleanup',
  'lessons.publish-due',
  'version.thumbnails',
  'cover.frame',
  'mail.class-published',
  'mail.trial-reminders',
  'mail.verify-email',
  'mail.sign-up-attempt',
  'mail.password-reset',
  'mail.review-requested',
  'mail.review-sent-back',
];

// Media jobs can run for most of an hour on a 2-core machine (facts: 60 min of 1080p needs ~45 min),
// so they expire after 4 hours, not pg-boss's 15-minute default; retries back off exponentially.
const QUEUE_OPTIONS: Record<JobName, PgBoss.Queue> = {
  'recording.probe': { name: 'recording.probe', retryLimit: 3, retryDelay: 10, retryBackoff: true, expireInSeconds: 600 },
  'recording.package': { name: 'recording.package', retryLimit: 3, retryDelay: 30, retryBackoff: true, expireInSeconds: 4 * 3600 },
  // Decoding and hearing the audio takes seconds to a few minutes; a retry re-downloads the source.
  'recording.audio-events': { name: 'recording.audio-events', retryLimit: 3, retryDelay: 30, retryBackoff: true, expireInSeconds: 3600 },
  'uploads.cleanup': { name: 'uploads.cleanup', retryLimit: 1, expireInSeconds: 600 },
  'lessons.publish-due': { name: 'lessons.publish-due', retryLimit: 1, expireInSeconds: 300 },
  'version.thumbnails': { name: 'version.thumbnails', retryLimit: 3, retryDelay: 20, retryBackoff: true, expireInSeconds: 3600 },
  // Staff wait on the page for this one: retry soon, twice; one frame takes seconds even from a long recording.
  'cover.frame': { name: 'cover.frame', retryLimit: 2, retryDelay: 5, retryBackoff: true, expireInSeconds: 900 },
  // Mail jobs retry when the SMTP server refuses; each message is sent once per key (sent_notices).
  'mail.class-published': { name: 'mail.class-published', retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 },
  'mail.trial-reminders': { name: 'mail.trial-reminders', retryLimit: 2, retryDelay: 120, expireInSeconds: 900 },
  // Account mail is what a person waits for: retry soon, a few times.
  'mail.verify-email': { name: 'mail.verify-email', retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 },
  'mail.sign-up-attempt': { name: 'mail.sign-up-attempt', retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 },
  'mail.password-reset': { name: 'mail.password-reset', retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 },
  // Staff hand-offs: someone waits on the other side, so retry soon.
  'mail.review-requested': { name: 'mail.review-requested', retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 },
  'mail.review-sent-back': { name: 'mail.review-sent-back', retryLimit: 5, retryDelay: 10, retryBackoff: true, expireInSeconds: 900 },
};

/** Starts pg-boss on the app database and makes sure every queue exists (sending to a missing one is silently dropped). */
export async function startQueue(databaseUrl: string): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: databaseUrl, application_name: 'roundmark-queue' });
  boss.on('error', (err) => console.error('queue error:', err));
  await boss.start();
  for (const name of JOB_NAMES) await boss.createQueue(name, QUEUE_OPTIONS[name]);
  return boss;
}

/** Sends a typed job; one job per key at a time, so a double click queues one. */
export async function sendJob<N extends JobName>(boss: PgBoss, name: N, data: JobPayloads[N], key?: string): Promise<string | null> {
  return boss.send(name, data, key ? { singletonKey: key, singletonSeconds: 60 } : {});
}

/**
 * Whether a job for this recording waits in the queue or runs (pg-boss keeps jobs in its own
 * schema on the app database; states created/retry/active). Lets recovery tell a step that only
 * waits its turn from one whose job was lost.
 */
export async function hasPendingRecordingJob(boss: PgBoss, name: JobName, recordingId: string): Promise<boolean> {
  const db = boss.getDb();
  const result = (await db.executeSql(
    `select 1 from pgboss.job where name = $1 and data->>'recordingId' = $2 and state in ('created', 'retry', 'active') limit 1`,
    [name, recordingId],
  )) as { rows: unknown[] };
  return result.rows.length > 0;
}

let shared: Promise<PgBoss> | undefined;

/** The process-wide queue (the web server only sends; the worker also works). */
export function queue(databaseUrl: string): Promise<PgBoss> {
  shared ??= startQueue(databaseUrl);
  return shared;
}
