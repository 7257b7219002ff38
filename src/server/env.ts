import { z } from 'zod';

/**
 * The one place that reads process.env. The server, the worker, scripts and drizzle.config.ts
 * all use it, so a missing or malformed setting fails at start-up with the full list.
 */
/** The local payments fake's settings (docker-free-dev/local.env); never used in production. */
const LOCAL_PAYMENTS = {
  apiUrl: 'http://127.0.0.1:12111',
  secretKey: 'sk_test_roundmark_local_only',
  webhookSecret: 'whsec_roundmark_local_only',
};

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  DATABASE_URL: z.string().url(),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3),
  S3_ACCESS_KEY_ID: z.string().min(1),
  S3_SECRET_ACCESS_KEY: z.string().min(1),
  S3_FORCE_PATH_STYLE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  SMTP_URL: z.string().url(),
  MAIL_FROM: z.string().min(3).default('Roundmark <no-reply@roundmark.example>'),
  PUBLIC_BASE_URL: z.string().url().default('http://127.0.0.1:4321'),
  MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(8 * 1024 ** 3),
  /** Payment provider's API base; unset in production means the real service. */
  PAYMENTS_API_URL: z.string().url().optional(),
  PAYMENTS_SECRET_KEY: z.string().min(1).optional(),
  PAYMENTS_WEBHOOK_SECRET: z.string().min(1).optional(),
  /**
   * The signing secret of the provider's second endpoint, the one for connected accounts' events
   * (the provider gives each endpoint its own). Unset: those events are checked with
   * PAYMENTS_WEBHOOK_SECRET, as with the local fake.
   */
  PAYMENTS_CONNECT_WEBHOOK_SECRET: z.string().min(1).optional(),
  /** The platform's application fee on every membership payment, in percent of what the member pays (0–100, two decimals at most). */
  PLATFORM_FEE_PERCENT: z.coerce
    .number()
    .min(0)
    .max(100)
    .refine((n) => Math.round(n * 100) === n * 100, 'at most two decimals')
    .default(5),
  /**
   * Reverse proxies whose X-Forwarded-For hops are believed, comma-separated: addresses, CIDR
   * ranges, or proxy-addr's names (loopback, linklocal, uniquelocal). Empty: the socket's address
   * is the client's, and X-Forwarded-For is ignored.
   */
  TRUSTED_PROXIES: z
    .string()
    .default('')
    .transform((v) => v.split(',').map((s) => s.trim()).filter(Boolean))
    .pipe(z.array(z.string().regex(/^(loopback|linklocal|uniquelocal|[0-9a-fA-F:.]+(\/\d{1,3})?)$/, 'use addresses, CIDR ranges, loopback, linklocal or uniquelocal'))),
})
  // Payment keys are required in production; elsewhere they fall back to the local fake's values
  // (docker-free-dev/local.env), so a forgotten key can never reach production silently.
  .superRefine((e, ctx) => {
    if (e.NODE_ENV !== 'production') return;
    for (const key of ['PAYMENTS_SECRET_KEY', 'PAYMENTS_WEBHOOK_SECRET'] as const) {
      if (!e[key]) ctx.addIssue({ code: 'custom', path: [key], message: 'required in production' });
    }
  })
  .transform((e) => ({
    ...e,
    PAYMENTS_API_URL: e.PAYMENTS_API_URL ?? (e.NODE_ENV === 'production' ? undefined : LOCAL_PAYMENTS.apiUrl),
    PAYMENTS_SECRET_KEY: e.PAYMENTS_SECRET_KEY ?? LOCAL_PAYMENTS.secretKey,
    PAYMENTS_WEBHOOK_SECRET: e.PAYMENTS_WEBHOOK_SECRET ?? LOCAL_PAYMENTS.webhookSecret,
  }));

export type Env = z.output<typeof envSchema>;

let cached: Env | undefined;

/** Reads and checks the environment once; throws with every problem listed. */
export function env(): Env {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(
      `Roundmark cannot start: these settings are missing or wrong:\n${lines.join('\n')}\n` +
        'Locally, `npm start` sets them from docker-free-dev/local.env.',
    );
  }
  cached = parsed.data;
  return cached;
}

/** True when the app runs as a production build with production settings. */
export const isProduction = () => env().NODE_ENV === 'production';

/**
 * Settings that have a sensible default and are needed where the full environment is not (the
 * ffmpeg runner in unit tests, drizzle-kit, the Astro config at build time). Still read only here.
 */
const settingsSchema = z.object({
  /** The studio this deployment serves (its slug). */
  STUDIO_SLUG: z.string().min(1).default('fernhill'),
  PUBLIC_BASE_URL: z.string().url().optional(),
  DATABASE_URL: z.string().optional(),
  /** Program paths; the variable names fluent-ffmpeg used to read, so existing set-ups keep working. */
  FFMPEG_PATH: z.string().min(1).default('ffmpeg'),
  FFPROBE_PATH: z.string().min(1).default('ffprobe'),
  /** Debian's speech synthesiser, for generated coach voices in demo and test media. */
  ESPEAK_PATH: z.string().min(1).default('espeak-ng'),
  /** A running recording step whose heartbeat is older than this lost its worker (tests shorten it). */
  ROUNDMARK_STALE_SECONDS: z.coerce.number().positive().default(90),
  /** The worker's scratch folder; a folder under the system's temp folder when unset. */
  ROUNDMARK_WORK_DIR: z.string().min(1).optional(),
  /** The owner's captured-mail preview page: on only in development and tests. */
  ROUNDMARK_MAIL_PREVIEW: z.string().optional().transform((v) => v === '1'),
  ROUNDMARK_MAIL_DIR: z.string().min(1).default('.data/mail'),
  /** `0` seeds without generating demo recordings (npm test makes its own small media). */
  ROUNDMARK_DEMO_MEDIA: z.string().optional().transform((v) => v !== '0'),
  /** Demo data (the invented scenario): the worker then also generates demo recordings. Local set-ups and tests only. */
  DEMO_DATA: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  /** src/serve.ts: where the build is, where to listen, and an optional certificate. */
  ROUNDMARK_DIST: z.string().min(1).default('dist'),
  /** Web server processes sharing the port (node:cluster); 1 serves from the process itself. */
  ROUNDMARK_APP_PROCESSES: z.coerce.number().int().min(1).max(64).default(1),
  /** Media jobs (probe, package) one worker process runs at the same time. */
  ROUNDMARK_MEDIA_CONCURRENCY: z.coerce.number().int().min(1).max(16).default(1),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(4321),
  SERVER_CERT_PATH: z.string().min(1).optional(),
  SERVER_KEY_PATH: z.string().min(1).optional(),
});

export type Settings = z.output<typeof settingsSchema>;
let cachedSettings: Settings | undefined;

/** The defaulted settings, read once; throws only on a malformed value. */
export function settings(): Settings {
  if (cachedSettings) return cachedSettings;
  const parsed = settingsSchema.safeParse(process.env);
  if (!parsed.success) {
    throw new Error(`Roundmark cannot start: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  }
  cachedSettings = parsed.data;
  return cachedSettings;
}
