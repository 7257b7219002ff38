import type PgBoss from 'pg-boss';
import type { S3Client } from '@aws-sdk/client-s3';
import type { AppDeps } from '../app';
import type { JobName, JobPayloads } from '../queue';

/** What every job handler receives besides its payload. */
export interface JobContext {
  deps: AppDeps;
  s3: S3Client;
  bucket: string;
  boss: PgBoss;
  /** Scratch space for this worker process. */
  workDir: string;
  /** Aborted when the worker is stopping; long steps stop and the job is retried later. */
  signal: AbortSignal;
  /** How often a running step proves its worker alive (a third of the stale limit). */
  heartbeatSeconds: number;
  send<N extends JobName>(name: N, data: JobPayloads[N], key?: string): Promise<void>;
}

/** An explicit outcome, logged by the worker. Throwing means "retry later". */
export type JobOutcome = { outcome: 'done' | 'skipped' | 'failed'; detail?: string };

/** Which attempt this is: on the last one a handler records that its work was interrupted. */
export interface JobAttempt {
  last: boolean;
}

export type JobHandler<N extends JobName> = (data: JobPayloads[N], ctx: JobContext, attempt: JobAttempt) => Promise<JobOutcome>;
