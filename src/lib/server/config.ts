import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { config as loadDotenv } from 'dotenv';
import { z } from 'zod';
import { MAX_FENCE_VERTICES } from '../schemas/plan';

/**
 * The app's configuration, read once from the environment (and `.env` when present).
 * Every variable is listed in `.env.example` and explained in the README.
 */
const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATA_DIR: z.string().min(1).default('./data'),
  DATABASE_URL: z.string().optional(),
  AUTH_SECRET: z.string().min(32, 'AUTH_SECRET must be at least 32 characters').optional(),
  PUBLIC_URL: z.string().url().optional(),
  MAX_JSON_BODY_BYTES: z.coerce.number().int().positive().default(256 * 1024),
  MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(1024 * 1024 * 1024),
  MAX_RASTER_CELLS: z.coerce.number().int().positive().default(64_000_000),
  MAX_FENCE_VERTICES: z.coerce.number().int().min(2).default(MAX_FENCE_VERTICES),
  MAX_FENCE_LINES_PER_PROPERTY: z.coerce.number().int().positive().default(5000),
  EXPENSIVE_REQUESTS_PER_MINUTE: z.coerce.number().int().positive().default(30),
  SIGN_IN_MAX_FAILURES_PER_EMAIL: z.coerce.number().int().positive().default(5),
  SIGN_IN_MAX_FAILURES_PER_IP: z.coerce.number().int().positive().default(20),
  SIGN_IN_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Gullyline <no-reply@gullyline.localhost>'),
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(20).default(6),
  DEV_MAIL_PAGE: z.enum(['true', 'false', '1', '0', '']).default('').transform((value) => value === 'true' || value === '1'),
  INVITATION_EXPIRY_DAYS: z.coerce.number().positive().max(90).default(7),
  WORK_ORDER_LINK_EXPIRY_DAYS: z.coerce.number().positive().max(365).default(30),
  MAX_PHOTO_BYTES: z.coerce.number().int().positive().default(20 * 1024 * 1024),
  PHOTO_S3_BUCKET: z.string().optional(),
  PHOTO_S3_ENDPOINT: z.string().url().optional().or(z.literal('')),
  PHOTO_S3_REGION: z.string().optional(),
  PHOTO_S3_ACCESS_KEY_ID: z.string().optional(),
  PHOTO_S3_SECRET_ACCESS_KEY: z.string().optional(),
  PHOTO_S3_FORCE_PATH_STYLE: z.enum(['true', 'false', '1', '0', '']).default('').transform((value) => value === 'true' || value === '1'),
});

export type AppConfig = {
  env: 'development' | 'production' | 'test';
  dataDir: string;
  databaseFile: string;
  authSecret: string;
  publicUrl: string | undefined;
  maxJsonBodyBytes: number;
  maxUploadBytes: number;
  maxRasterCells: number;
  maxFenceVertices: number;
  maxFenceLinesPerProperty: number;
  /** Per user, per minute, on the routes listed in `request-limit.ts`. */
  expensiveRequestsPerMinute: number;
  signIn: { maxFailuresPerEmail: number; maxFailuresPerIp: number; windowMs: number };
  smtpUrl: string | undefined;
  mailFrom: string;
  /** Sends tried per message before it is marked failed. */
  mailMaxAttempts: number;
  /** Whether /dev/mail is served; always outside production. */
  devMailPage: boolean;
  invitationExpiryMs: number;
  /** How long a contractor's read-only work order link works after the order is sent. */
  workOrderLinkExpiryMs: number;
  /** The largest inspection photo accepted, in bytes. */
  maxPhotoBytes: number;
  /** Where photos are kept: an S3 bucket when PHOTO_S3_BUCKET is set, else DATA_DIR/photos. */
  photoS3: PhotoS3Config | undefined;
};

export type PhotoS3Config = {
  bucket: string;
  endpoint: string | undefined;
  region: string;
  accessKeyId: string | undefined;
  secretAccessKey: string | undefined;
  forcePathStyle: boolean;
};

let cached: AppConfig | undefined;

/** Reads and checks the configuration once; throws with every problem listed when it is wrong. */
export function getConfig(): AppConfig {
  if (cached) return cached;
  loadDotenv({ quiet: true });
  cached = parseConfig(process.env);
  return cached;
}

/** Checks a set of environment variables; exported for tests (the app calls {@link getConfig}). */
export function parseConfig(variables: Record<string, string | undefined>): AppConfig {
  const parsed = schema.safeParse(variables);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Gullyline configuration is invalid:\n  ${problems.join('\n  ')}`);
  }
  const env = parsed.data;
  const dataDir = path.resolve(env.DATA_DIR);
  return {
    env: env.NODE_ENV,
    dataDir,
    databaseFile: resolveDatabaseFile(env.DATABASE_URL, dataDir),
    authSecret: env.AUTH_SECRET ?? developmentSecret(env.NODE_ENV, dataDir),
    publicUrl: env.PUBLIC_URL,
    maxJsonBodyBytes: env.MAX_JSON_BODY_BYTES,
    maxUploadBytes: env.MAX_UPLOAD_BYTES,
    maxRasterCells: env.MAX_RASTER_CELLS,
    maxFenceVertices: env.MAX_FENCE_VERTICES,
    maxFenceLinesPerProperty: env.MAX_FENCE_LINES_PER_PROPERTY,
    expensiveRequestsPerMinute: env.EXPENSIVE_REQUESTS_PER_MINUTE,
    signIn: {
      maxFailuresPerEmail: env.SIGN_IN_MAX_FAILURES_PER_EMAIL,
      maxFailuresPerIp: env.SIGN_IN_MAX_FAILURES_PER_IP,
      windowMs: env.SIGN_IN_WINDOW_MINUTES * 60_000,
    },
    smtpUrl: env.SMTP_URL || undefined,
    mailFrom: env.MAIL_FROM,
    mailMaxAttempts: env.MAIL_MAX_ATTEMPTS,
    devMailPage: env.DEV_MAIL_PAGE || env.NODE_ENV !== 'production',
    invitationExpiryMs: env.INVITATION_EXPIRY_DAYS * 24 * 60 * 60_000,
    workOrderLinkExpiryMs: env.WORK_ORDER_LINK_EXPIRY_DAYS * 24 * 60 * 60_000,
    maxPhotoBytes: env.MAX_PHOTO_BYTES,
    photoS3: env.PHOTO_S3_BUCKET
      ? {
          bucket: env.PHOTO_S3_BUCKET,
          endpoint: env.PHOTO_S3_ENDPOINT || undefined,
          region: env.PHOTO_S3_REGION || 'us-east-1',
          accessKeyId: env.PHOTO_S3_ACCESS_KEY_ID || undefined,
          secretAccessKey: env.PHOTO_S3_SECRET_ACCESS_KEY || undefined,
          forcePathStyle: env.PHOTO_S3_FORCE_PATH_STYLE,
        }
      : undefined,
  };
}

/** `DATABASE_URL` may be `file:./path.sqlite`, `sqlite:path` or a bare path; default `DATA_DIR/gullyline.sqlite`. */
function resolveDatabaseFile(url: string | undefined, dataDir: string): string {
  if (!url) return path.join(dataDir, 'gullyline.sqlite');
  const bare = url.replace(/^(file|sqlite):(\/\/)?/, '');
  return path.resolve(bare);
}

/**
 * Outside production a missing AUTH_SECRET is replaced by a random one kept in the data folder,
 * so the demo starts with no set-up and sessions survive a restart. Production must set it.
 */
function developmentSecret(env: AppConfig['env'], dataDir: string): string {
  if (env === 'production') {
    throw new Error('Gullyline configuration is invalid:\n  AUTH_SECRET: required in production (32+ random characters)');
  }
  const file = path.join(dataDir, 'auth-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}
