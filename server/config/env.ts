import { z } from 'zod';
import type { StorageConfig } from '../lib/storage';

const bool = z.enum(['true', 'false', '1', '0']).transform((v) => v === 'true' || v === '1');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().min(1, 'DATABASE_URL is required'),
  SMTP_URL: z.string().default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().default('Tunewright <no-reply@tunewright.test>'),
  APP_URL: z.string().optional(),
  SESSION_SECRET: z.string().min(16).optional(),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  RATE_LIMIT_AUTH_PER_15MIN: z.coerce.number().int().min(1).default(20),
  RATE_LIMIT_UPLOAD_PER_15MIN: z.coerce.number().int().min(1).default(60),
  SIGN_IN_ATTEMPTS_PER_ACCOUNT_PER_15MIN: z.coerce.number().int().min(1).default(10),
  UPLOAD_DIR: z.string().optional(),
  STORAGE_DRIVER: z.enum(['disk', 's3']).default('disk'),
  STORAGE_S3_ENDPOINT: z.string().optional(),
  STORAGE_S3_REGION: z.string().default('us-east-1'),
  STORAGE_S3_BUCKET: z.string().optional(),
  STORAGE_S3_ACCESS_KEY_ID: z.string().optional(),
  STORAGE_S3_SECRET_ACCESS_KEY: z.string().optional(),
  STORAGE_S3_FORCE_PATH_STYLE: bool.default(true),
  TRUST_PROXY: bool.default(false),
  OUTBOX_INTERVAL_MS: z.coerce.number().int().min(100).default(5000),
  /** The local demo's and the tests' helpers (the mail viewer, the built-in session secret): off unless turned on. */
  DEV_TOOLS: bool.default(false),
  /** Sessions end after this long without a request (members; moderators and admins get a quarter of it, at least an hour). */
  SESSION_IDLE_HOURS: z.coerce
    .number()
    .min(0.05)
    .max(24 * 90)
    .default(48),
  /** Sessions end this long after sign-in, however active. */
  SESSION_ABSOLUTE_DAYS: z.coerce.number().min(0.01).max(365).default(14),
});

export type Config = {
  env: 'development' | 'production' | 'test';
  production: boolean;
  host: string;
  port: number;
  databaseUrl: string;
  smtpUrl: string;
  mailFrom: string;
  appUrl: string;
  sessionSecret: string;
  bcryptCost: number;
  logLevel: string;
  rateLimits: { authPer15Min: number; uploadPer15Min: number; signInPerAccountPer15Min: number };
  uploadDir: string;
  storage: StorageConfig;
  trustProxy: boolean;
  outboxIntervalMs: number;
  /** The mail viewer routes and the built-in development secret; only when DEV_TOOLS=true, never in production. */
  devTools: boolean;
  sessions: { idleMs: number; privilegedIdleMs: number; absoluteMs: number };
};

/** The secret the local demo and the tests sign cookies with; nothing else may start with it. */
export const DEV_SESSION_SECRET = 'tunewright-local-demo-secret-not-for-production';

/**
 * Refuses to serve with the built-in development secret unless the development helpers were turned on
 * (DEV_TOOLS=true, which only the local demo and the tests do): anyone can read that secret here.
 */
export function assertServeable(config: Config) {
  if (config.sessionSecret === DEV_SESSION_SECRET && !config.devTools) {
    throw new Error(
      'Invalid environment:\nSESSION_SECRET: required (the built-in development secret is used only with DEV_TOOLS=true, by the local demo and the tests)',
    );
  }
}

/** Parses process.env (or a given map) into the app's configuration; throws with every problem listed. */
export function loadConfig(source: Record<string, string | undefined> = process.env): Config {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === 'production';
  if (e.STORAGE_DRIVER === 's3' && !e.STORAGE_S3_BUCKET) throw new Error('Invalid environment:\nSTORAGE_S3_BUCKET: required when STORAGE_DRIVER=s3');
  // Fail closed: the development helpers are on only where the local demo or the tests turn them on.
  if (production && e.DEV_TOOLS) throw new Error('Invalid environment:\nDEV_TOOLS: must not be on in production');
  if (production && !e.SESSION_SECRET) throw new Error('Invalid environment:\nSESSION_SECRET: required in production');
  return {
    env: e.NODE_ENV,
    production,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL,
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    appUrl: (e.APP_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, ''),
    sessionSecret: e.SESSION_SECRET ?? DEV_SESSION_SECRET,
    bcryptCost: e.BCRYPT_COST ?? (e.NODE_ENV === 'test' ? 4 : 12),
    logLevel: e.LOG_LEVEL ?? (e.NODE_ENV === 'test' ? 'silent' : 'info'),
    rateLimits: {
      authPer15Min: e.RATE_LIMIT_AUTH_PER_15MIN,
      uploadPer15Min: e.RATE_LIMIT_UPLOAD_PER_15MIN,
      signInPerAccountPer15Min: e.SIGN_IN_ATTEMPTS_PER_ACCOUNT_PER_15MIN,
    },
    uploadDir: e.UPLOAD_DIR ?? '.data/uploads',
    storage: {
      driver: e.STORAGE_DRIVER,
      uploadDir: e.UPLOAD_DIR ?? '.data/uploads',
      s3: e.STORAGE_S3_BUCKET
        ? {
            endpoint: e.STORAGE_S3_ENDPOINT,
            region: e.STORAGE_S3_REGION,
            bucket: e.STORAGE_S3_BUCKET,
            accessKeyId: e.STORAGE_S3_ACCESS_KEY_ID,
            secretAccessKey: e.STORAGE_S3_SECRET_ACCESS_KEY,
            forcePathStyle: e.STORAGE_S3_FORCE_PATH_STYLE,
          }
        : null,
    },
    trustProxy: e.TRUST_PROXY,
    outboxIntervalMs: e.OUTBOX_INTERVAL_MS,
    devTools: e.DEV_TOOLS,
    sessions: {
      idleMs: e.SESSION_IDLE_HOURS * 3600_000,
      privilegedIdleMs: Math.min(e.SESSION_IDLE_HOURS * 3600_000, Math.max(3600_000, (e.SESSION_IDLE_HOURS * 3600_000) / 4)),
      absoluteMs: e.SESSION_ABSOLUTE_DAYS * 24 * 3600_000,
    },
  };
}
