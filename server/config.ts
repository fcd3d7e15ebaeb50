import { z } from 'zod';

const bool = z
  .enum(['0', '1', 'true', 'false'])
  .transform((v) => v === '1' || v === 'true');

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().min(1).default('postgres://postgres@127.0.0.1:54329/hoodline'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  SESSION_SECRET: z.string().min(16).default('hoodline-dev-only-secret-change-me'),
  /** Set behind an HTTPS-terminating proxy: trusts X-Forwarded-* and marks the cookie Secure. */
  TRUST_PROXY: bool.default(false),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  /** Start the in-process fake SMTP server (dev and test). */
  FAKE_SMTP: bool.default(true),
  MAIL_FROM: z.string().default('Hoodline <hoodline@railroad.example>'),
  LOGIN_RATE_LIMIT: z.coerce.number().int().positive().default(20),
  LOGIN_RATE_WINDOW_S: z.coerce.number().int().positive().default(900),
  /** State-changing requests a person may make per minute. */
  WRITE_RATE_LIMIT: z.coerce.number().int().positive().default(600),
  LOCKOUT_AFTER: z.coerce.number().int().positive().default(8),
  LOCKOUT_MINUTES: z.coerce.number().int().positive().default(15),
  PHOTO_DIR: z.string().default('.data/photos'),
  PHOTO_MAX_BYTES: z.coerce.number().int().positive().default(8 * 1024 * 1024),
  STORAGE_DRIVER: z.enum(['disk', 's3']).default('disk'),
  S3_ENDPOINT: z.string().optional(),
  S3_BUCKET: z.string().default('hoodline-photos'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  OUTBOX_POLL_MS: z.coerce.number().int().min(50).default(3000),
  SERVE_DIST: bool.default(false),
  DIAGRAMS_DIR: z.string().default('diagrams'),
  /** How long a signed-in person's row is reused between requests (other processes see a role change this late). */
  PERSON_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(2000),
  /** Server processes sharing the port on this machine (node:cluster); one per core is usual. */
  WEB_CONCURRENCY: z.coerce.number().int().min(1).max(64).default(1),
  /** Run background workers (outbox, digest) in this process. */
  WORKERS: bool.default(true),
});

export type Config = z.infer<typeof EnvSchema>;

/** Reads the environment once at start; a bad value stops the process with the variable's name. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Bad environment:\n${lines.join('\n')}`);
  }
  return parsed.data;
}
