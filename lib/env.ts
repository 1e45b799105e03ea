import { z } from 'zod';

/**
 * The process environment, parsed once with zod. Mirrored by `.env.example`.
 * `npm start` and `npm test` fill in the database settings of the private
 * MariaDB they start; a hosted deployment sets them itself.
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: z.coerce.number().int().positive().default(3317),
  DB_NAME: z.string().min(1).default('trialbed'),
  DB_USER: z.string().min(1).default('trialbed'),
  DB_PASSWORD: z.string().default(''),
  /** Read replicas for SELECTs, comma-separated host:port (see README, "Growing past one machine"). */
  DB_READ_REPLICAS: z.string().default(''),
  DB_POOL_MAX: z.coerce.number().int().positive().default(10),
  DATA_DIR: z.string().default('.data'),
  AUTH_URL: z.string().url().default('http://localhost:3000'),
  TRIALBED_DEMO: z.enum(['0', '1']).default('0'),
  /** 1: show the captured-mail page /dev/mailbox even when demo mode is off (local work only). */
  MAILBOX: z.enum(['0', '1']).default('0'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_USER: z.string().default(''),
  SMTP_PASSWORD: z.string().default(''),
  SMTP_SECURE: z.enum(['0', '1']).default('0'),
  MAIL_FROM: z.string().default('Trialbed <no-reply@trialbed.invalid>'),
  /** Auth.js's secret; also signs unsubscribe links (HMAC). `npm start` generates one. */
  AUTH_SECRET: z.string().default(''),
  /** How often the outbox worker looks for due mail when it found none (milliseconds). */
  MAIL_POLL_MS: z.coerce.number().int().min(100).max(600_000).default(5_000),
  /** Attempts per mail before it is marked failed (retries back off exponentially). */
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(12),
  /** The first retry's delay in seconds; each later one doubles, up to 6 hours. */
  MAIL_RETRY_BASE_SECONDS: z.coerce.number().min(0.01).max(3_600).default(30),
  /** Hours between weekly digests (168 = a week); the worker sends them on this schedule. */
  DIGEST_EVERY_HOURS: z.coerce.number().min(1).max(24 * 31).default(168),
  /** 0: `npm start` does not start the outbox worker (run `npm run mail:worker` elsewhere). */
  MAIL_WORKER: z.enum(['0', '1']).default('1'),
  /** Where photos go: `local` (DATA_DIR/uploads) or an S3-compatible bucket. */
  STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
  /** S3-compatible endpoint; empty for AWS itself (then S3_REGION picks the endpoint). */
  S3_ENDPOINT: z.union([z.literal(''), z.string().url()]).default(''),
  S3_BUCKET: z.string().default(''),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().default(''),
  S3_SECRET_ACCESS_KEY: z.string().default(''),
  /** 1: bucket in the path (http://host/bucket/key), as most self-hosted S3 servers need. */
  S3_FORCE_PATH_STYLE: z.enum(['0', '1']).default('0'),
}).superRefine((env, ctx) => {
  if (env.STORAGE_DRIVER === 's3' && !env.S3_BUCKET) {
    ctx.addIssue({ code: 'custom', path: ['S3_BUCKET'], message: 'required when STORAGE_DRIVER=s3' });
  }
});

export type Env = z.infer<typeof EnvSchema>;

let cached: Env | null = null;

/** Returns the validated environment; throws with every bad field named. */
export function getEnv(): Env {
  if (cached) return cached;
  const parsed = EnvSchema.safeParse(process.env);
  if (!parsed.success) {
    const fields = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`Invalid environment: ${fields}`);
  }
  cached = parsed.data;
  return cached;
}

/** True when the invented demo scenario and its sign-in shortcuts are on. */
export function isDemoMode(): boolean {
  return getEnv().TRIALBED_DEMO === '1';
}

/**
 * True when /dev/mailbox shows the mail caught by the local capture server:
 * in demo mode (`npm start`) or with MAILBOX=1. Never on a real site: the
 * page shows everyone's sign-in links.
 */
export function isMailboxEnabled(): boolean {
  const env = getEnv();
  return env.TRIALBED_DEMO === '1' || env.MAILBOX === '1';
}
