import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { z } from 'zod';

/** Repository root, so every path works whatever folder a script starts in. */
export const PROJECT_ROOT = path.resolve(import.meta.dirname, '..');

const port = z.coerce.number().int().min(1).max(65535);

/** Everything Etchfile reads from the environment, parsed and checked once at start. */
const schema = z
  .object({
    EF_MODE: z.enum(['local', 'production']).default('local'),
    EF_HOST: z.string().default('127.0.0.1'),
    EF_PORT: port.default(8080),
    EF_PUBLIC_URL: z.url().optional(),
    EF_DB_HOST: z.string().default('127.0.0.1'),
    EF_DB_PORT: port.default(54329),
    EF_DB_NAME: z.string().regex(/^[a-z_][a-z0-9_]*$/).default('etchfile'),
    EF_DB_USER: z.string().default('etchfile'),
    EF_DB_PASSWORD: z.string().default('etchfile-local'),
    EF_SESSION_SECRET: z.string().min(32).optional(),
    EF_SESSION_HOURS: z.coerce.number().positive().default(12),
    EF_SMTP_HOST: z.string().default('127.0.0.1'),
    EF_SMTP_PORT: port.default(2525),
    EF_SMTP_SECURE: z.stringbool().default(false),
    EF_SMTP_USER: z.string().optional(),
    EF_SMTP_PASSWORD: z.string().optional(),
    EF_MAIL_FROM: z.string().default('Etchfile <no-reply@etchfile.invalid>'),
    EF_FAKE_SMTP: z.stringbool().optional(),
    EF_STORAGE_DIR: z.string().default(path.join(PROJECT_ROOT, 'storage')),
    EF_CLIENT_DIR: z.string().default(path.join(PROJECT_ROOT, 'dist', 'client', 'browser')),
    EF_SIGN_IN_LIMIT: z.coerce.number().int().positive().default(8),
    EF_SIGN_IN_WINDOW_MIN: z.coerce.number().positive().default(15),
    EF_RESET_TOKEN_MIN: z.coerce.number().positive().default(60),
    EF_INVITE_TOKEN_HOURS: z.coerce.number().positive().default(72),
    EF_JSON_LIMIT: z.string().default('100kb'),
    EF_LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'silent']).default('info'),
    EF_STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
    EF_S3_ENDPOINT: z.url().optional(),
    EF_S3_REGION: z.string().default('us-east-1'),
    EF_S3_BUCKET: z.string().default('etchfile'),
    EF_S3_ACCESS_KEY_ID: z.string().optional(),
    EF_S3_SECRET_ACCESS_KEY: z.string().optional(),
    EF_S3_FORCE_PATH_STYLE: z.stringbool().default(true),
    // 2 GiB: a stitched 20000² 16-bit RGB panorama is 2.4 GB uncompressed, most arrive compressed.
    EF_UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(2 * 1024 ** 3),
    // 400 Mpx admits a 20000 × 20000 px panorama; larger declared sizes are refused before decoding.
    EF_MAX_IMAGE_PIXELS: z.coerce.number().int().positive().default(400_000_000),
    EF_WORKER: z.stringbool().default(true),
    EF_JOB_TIMEOUT_MIN: z.coerce.number().positive().default(30),
    // Notification mail: first retry after about this many seconds, doubling; the daily digest's hour.
    EF_MAIL_RETRY_SECONDS: z.coerce.number().int().positive().default(60),
    EF_MAIL_RETRY_LIMIT: z.coerce.number().int().min(0).default(12),
    EF_DIGEST_HOUR_UTC: z.coerce.number().int().min(0).max(23).default(6),
  })
  .refine((env) => env.EF_MODE === 'local' || env.EF_SESSION_SECRET, {
    error: 'EF_SESSION_SECRET (32+ characters) is required in production mode.',
    path: ['EF_SESSION_SECRET'],
  });

export type Config = ReturnType<typeof loadConfig>;

/** Parses the given environment (process.env by default) into a typed config, or throws listing every problem. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env) {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const local = e.EF_MODE === 'local';
  return {
    mode: e.EF_MODE,
    local,
    host: e.EF_HOST,
    port: e.EF_PORT,
    publicUrl: e.EF_PUBLIC_URL ?? `http://${e.EF_HOST}:${e.EF_PORT}`,
    db: { host: e.EF_DB_HOST, port: e.EF_DB_PORT, name: e.EF_DB_NAME, user: e.EF_DB_USER, password: e.EF_DB_PASSWORD },
    // A fresh random secret in local mode only logs people out on restart, which is fine there.
    sessionSecret: e.EF_SESSION_SECRET ?? randomBytes(32).toString('hex'),
    sessionMaxAgeMs: e.EF_SESSION_HOURS * 3600_000,
    smtp: {
      host: e.EF_SMTP_HOST,
      port: e.EF_SMTP_PORT,
      secure: e.EF_SMTP_SECURE,
      user: e.EF_SMTP_USER,
      password: e.EF_SMTP_PASSWORD,
      from: e.EF_MAIL_FROM,
      // The fake server keeps messages for the admin outbox; it only ever runs in local mode.
      fake: local && (e.EF_FAKE_SMTP ?? true),
    },
    storageDir: e.EF_STORAGE_DIR,
    clientDir: e.EF_CLIENT_DIR,
    signInLimit: { max: e.EF_SIGN_IN_LIMIT, windowMs: e.EF_SIGN_IN_WINDOW_MIN * 60_000 },
    resetTokenMs: e.EF_RESET_TOKEN_MIN * 60_000,
    inviteTokenMs: e.EF_INVITE_TOKEN_HOURS * 3600_000,
    jsonLimit: e.EF_JSON_LIMIT,
    logLevel: e.EF_LOG_LEVEL,
    files: {
      driver: e.EF_STORAGE_DRIVER,
      s3: {
        endpoint: e.EF_S3_ENDPOINT,
        region: e.EF_S3_REGION,
        bucket: e.EF_S3_BUCKET,
        accessKeyId: e.EF_S3_ACCESS_KEY_ID,
        secretAccessKey: e.EF_S3_SECRET_ACCESS_KEY,
        forcePathStyle: e.EF_S3_FORCE_PATH_STYLE,
      },
    },
    images: {
      uploadMaxBytes: e.EF_UPLOAD_MAX_BYTES,
      maxPixels: e.EF_MAX_IMAGE_PIXELS,
    },
    /** Run the derivatives worker inside this process (`npm start`); `npm run worker` runs more elsewhere. */
    worker: e.EF_WORKER,
    jobTimeoutSeconds: Math.round(e.EF_JOB_TIMEOUT_MIN * 60),
    /** Notification mail retries (with back-off) and the hour (UTC) the daily digest goes out. */
    notifications: { retryDelaySeconds: e.EF_MAIL_RETRY_SECONDS, retryLimit: e.EF_MAIL_RETRY_LIMIT, digestHourUtc: e.EF_DIGEST_HOUR_UTC },
  };
}
