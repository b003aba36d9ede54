import { z } from 'zod';

const bool = z
  .enum(['0', '1', 'true', 'false'])
  .transform((v) => v === '1' || v === 'true');

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  APP_URL: z.string().url().optional(),
  DATABASE_URL: z.string().startsWith('postgres://', 'DATABASE_URL must be a postgres:// URL'),
  /** a streaming replica of DATABASE_URL for Debrief's analytics and long lists; empty for none */
  DATABASE_REPLICA_URL: z.union([z.literal(''), z.string().startsWith('postgres://', 'DATABASE_REPLICA_URL must be a postgres:// URL')]).default(''),
  /** a replica further behind than this is not read; Debrief reads the primary until it catches up */
  REPLICA_MAX_LAG_SECONDS: z.coerce.number().positive().max(3600).default(5),
  SESSION_SECRET: z.string().min(16).default('sparkwright-local-session-secret'),
  DEMO_PASSWORD: z.string().min(8).default('spark-demo-2026'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(0),
  MAIL_FROM: z.string().default('Sparkwright <no-reply@larkspur.test>'),
  S3_ENDPOINT: z.string().default(''),
  S3_BUCKET: z.string().default('sparkwright-photos'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY: z.string().default('S3RVER'),
  S3_SECRET_KEY: z.string().default('S3RVER'),
  LOCAL_FAKES: bool.default(true),
  /** with LOCAL_FAKES=0: the folder where a fake receiver in another process keeps its mail (npm run cluster) */
  MAILBOX_DIR: z.string().default(''),
  DATA_DIR: z.string().default('.data'),
  SERVE_CLIENT: bool.default(true),
  LOGIN_RATE_LIMIT: z.coerce.number().int().min(1).default(10),
  /** a session unused this long is over (checked to the 5 minutes in which use is recorded) */
  SESSION_IDLE_MINUTES: z.coerce.number().int().min(10).max(24 * 60).default(120),
  /** a session is over this long after sign-in, however busy: one shift */
  SESSION_MAX_HOURS: z.coerce.number().min(1).max(24 * 7).default(12),
  ABANDON_AFTER_HOURS: z.coerce.number().positive().default(24),
  /** invented diagnoses seeded into an empty demo shop so that Debrief is never empty; 0 for none */
  DEMO_HISTORY: z.coerce.number().int().min(0).max(100_000).default(300),
});

export type Config = z.infer<typeof EnvSchema> & { appUrl: string };

/** Reads the environment once; an invalid setting stops the process with a readable message. */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Sparkwright cannot start; fix these settings:\n${lines.join('\n')}`);
  }
  const cfg = parsed.data;
  return { ...cfg, appUrl: cfg.APP_URL ?? `http://localhost:${cfg.PORT}` };
}
