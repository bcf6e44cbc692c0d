import { z } from 'zod';

// Every setting has a loopback default so `npm start` needs no .env file; point the
// variables at a real PostgreSQL, S3, SMTP server or carrier to use those instead.
const bool = z
  .union([z.boolean(), z.string()])
  .transform((v) => (typeof v === 'boolean' ? v : ['1', 'true', 'yes', 'on'].includes(v.toLowerCase())));

const LOCAL_AUTH_SECRET = 'loadproof-local-secret-change-me-in-production';
const LOCAL_S3_KEY = 'S3RVER';
const LOOPBACK = new Set(['127.0.0.1', 'localhost', '::1', '[::1]']);

const schema = z.object({
  DATABASE_URL: z.url().default('postgres://loadproof@127.0.0.1:54329/loadproof'),
  APP_URL: z.url().default('http://127.0.0.1:3000'),
  AUTH_SECRET: z.string().min(16).default(LOCAL_AUTH_SECRET),
  /** Local mode (fakes, Mailbox page). Unset: local exactly when APP_URL is on loopback. */
  LOADPROOF_LOCAL: bool.optional(),

  S3_ENDPOINT: z.url().default('http://127.0.0.1:4569'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).default('loadproof-evidence'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  S3_FORCE_PATH_STYLE: bool.default(true),

  SMTP_HOST: z.string().min(1).default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Loadproof <no-reply@loadproof.local>'),
  /** HTTP view of the local mail catcher; empty turns the caught-mail page off. */
  LOCAL_MAILBOX_URL: z.string().default('http://127.0.0.1:2580'),

  CARRIER_URL: z.url().default('http://127.0.0.1:4600'),
  CARRIER_API_KEY: z.string().default('local-carrier-key'),
  /** How often the worker asks the carrier about parcels on their way. */
  CARRIER_POLL_SECONDS: z.coerce.number().int().min(1).max(86400).default(15),
});

// Outside local mode the well-known local defaults are refused: a forgotten AUTH_SECRET would
// let anyone who knows it forge a session for any user.
export const envSchema = schema
  .transform((e) => ({ ...e, LOADPROOF_LOCAL: e.LOADPROOF_LOCAL ?? LOOPBACK.has(new URL(e.APP_URL).hostname) }))
  .superRefine((e, ctx) => {
    if (e.LOADPROOF_LOCAL) return;
    if (e.AUTH_SECRET === LOCAL_AUTH_SECRET) ctx.addIssue({ code: 'custom', path: ['AUTH_SECRET'], message: 'set a long random secret of your own outside local mode' });
    if (e.S3_ACCESS_KEY_ID === LOCAL_S3_KEY || e.S3_SECRET_ACCESS_KEY === LOCAL_S3_KEY) {
      ctx.addIssue({ code: 'custom', path: ['S3_ACCESS_KEY_ID'], message: 'the local storage fake’s keys are refused outside local mode' });
    }
  });

export type Env = z.infer<typeof envSchema>;

export function parseEnv(source: Record<string, string | undefined>): Env {
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ''));
  const result = envSchema.safeParse(cleaned);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  return result.data;
}

let cached: Env | undefined;
export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}

/** Reads the environment again; for tests that point a client at a fake of their own. */
export function reloadEnv(): Env {
  cached = undefined;
  return env();
}

export function databaseUrl(): string {
  return env().DATABASE_URL;
}
