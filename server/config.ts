import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { z } from 'zod';

const booleanFromEnv = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((value) => value === 'true' || value === '1' || value === 'yes');

/** Every setting the server reads from the environment, with its default. */
export const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  PUBLIC_URL: z.url().optional(),
  DATABASE_URL: z.url().optional(),
  SMTP_URL: z.url().optional(),
  MAIL_FROM: z.string().min(3).default('Likeness <no-reply@likeness.invalid>'),
  SESSION_TTL_HOURS: z.coerce.number().positive().default(168),
  INVITATION_LINK_TTL_HOURS: z.coerce.number().positive().default(168),
  SIGN_IN_LINK_TTL_MINUTES: z.coerce.number().positive().default(30),
  SET_PASSWORD_LINK_TTL_HOURS: z.coerce.number().positive().default(72),
  PASSWORD_RESET_TTL_MINUTES: z.coerce.number().positive().default(60),
  RATE_LIMIT_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  RATE_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(30),
  RATE_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(8),
  TRUST_PROXY: booleanFromEnv.default(false),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  LIKENESS_DATA_DIR: z.string().min(1).default('.data'),
  PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
  LOAD_DEMO: booleanFromEnv.default(true),
  /** all: web and jobs in one process (npm start); web: HTTP and console events; worker: jobs. */
  PROCESS_ROLE: z.enum(['all', 'web', 'worker']).default('all'),
  MAIL_CATCHER_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  STORAGE: z.enum(['local', 's3']).default('local'),
  STORAGE_LOCAL_ROOT: z.string().min(1).optional(),
  S3_BUCKET: z.string().min(1).optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_ENDPOINT: z.url().optional(),
  S3_FORCE_PATH_STYLE: booleanFromEnv.default(false),
  UPLOAD_MAX_MB: z.coerce.number().int().min(1).max(10_000).default(200),
  UPLOAD_MAX_MEGAPIXELS: z.coerce.number().int().min(1).max(1000).default(100),
  /** Signs proof-image URLs; set it when several app processes serve one site. */
  URL_SIGNING_SECRET: z.string().min(32).optional(),
  /** Written as the credit (and in the copyright) of delivered portraits. */
  STUDIO_NAME: z.string().min(1).max(100).default('Northlight Portrait Co.'),
  PROOF_URL_TTL_MINUTES: z.coerce.number().int().min(1).max(1440).default(60),
});

export type RawConfig = z.infer<typeof configSchema>;

export interface AppConfig {
  env: RawConfig['NODE_ENV'];
  publicUrl: string;
  mailFrom: string;
  studioName: string;
  trustProxy: boolean;
  logLevel: RawConfig['LOG_LEVEL'];
  sessionTtlMs: number;
  invitationLinkTtlMs: number;
  signInLinkTtlMs: number;
  setPasswordLinkTtlMs: number;
  passwordResetTtlMs: number;
  rateLimit: { windowMs: number; perAddress: number; perAccount: number };
  storage: StorageSettings;
  /** Files still arriving live in `folder` (tus); no file over maxBytes or maxPixels is kept. */
  uploads: { folder: string; maxBytes: number; maxPixels: number };
  /** Proof previews are served through signed URLs that expire. */
  proofUrls: { secret: string; ttlMs: number };
}

/**
 * Where frames and their derived files are kept. S3 credentials are not settings here: the SDK
 * reads AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY (or a profile or instance role) itself.
 */
export type StorageSettings =
  | { kind: 'local'; root: string }
  | { kind: 's3'; bucket: string; region: string; endpoint?: string; forcePathStyle: boolean };

const HOUR = 3_600_000;
const MINUTE = 60_000;

export function parseEnvironment(env: NodeJS.ProcessEnv): RawConfig {
  const result = configSchema.safeParse(env);
  if (!result.success) {
    const lines = result.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid configuration in the environment:\n${lines.join('\n')}`);
  }
  return result.data;
}

export function toAppConfig(raw: RawConfig): AppConfig {
  return {
    env: raw.NODE_ENV,
    publicUrl: (raw.PUBLIC_URL ?? `http://localhost:${raw.PORT}`).replace(/\/$/, ''),
    mailFrom: raw.MAIL_FROM,
    studioName: raw.STUDIO_NAME,
    trustProxy: raw.TRUST_PROXY,
    logLevel: raw.LOG_LEVEL,
    sessionTtlMs: raw.SESSION_TTL_HOURS * HOUR,
    invitationLinkTtlMs: raw.INVITATION_LINK_TTL_HOURS * HOUR,
    signInLinkTtlMs: raw.SIGN_IN_LINK_TTL_MINUTES * MINUTE,
    setPasswordLinkTtlMs: raw.SET_PASSWORD_LINK_TTL_HOURS * HOUR,
    passwordResetTtlMs: raw.PASSWORD_RESET_TTL_MINUTES * MINUTE,
    rateLimit: {
      windowMs: raw.RATE_LIMIT_WINDOW_MINUTES * MINUTE,
      perAddress: raw.RATE_LIMIT_PER_ADDRESS,
      perAccount: raw.RATE_LIMIT_PER_ACCOUNT,
    },
    storage: toStorageSettings(raw),
    uploads: {
      folder: path.resolve(raw.LIKENESS_DATA_DIR, 'uploads-in-flight'),
      maxBytes: raw.UPLOAD_MAX_MB * 1_000_000,
      maxPixels: raw.UPLOAD_MAX_MEGAPIXELS * 1_000_000,
    },
    proofUrls: {
      // Without a configured secret each process makes its own: a restart only means the
      // proofs page asks for fresh URLs, which it does on every load anyway.
      secret: raw.URL_SIGNING_SECRET ?? randomBytes(32).toString('hex'),
      ttlMs: raw.PROOF_URL_TTL_MINUTES * MINUTE,
    },
  };
}

function toStorageSettings(raw: RawConfig): StorageSettings {
  if (raw.STORAGE === 'local') {
    return {
      kind: 'local',
      root: path.resolve(raw.STORAGE_LOCAL_ROOT ?? path.join(raw.LIKENESS_DATA_DIR, 'storage')),
    };
  }
  // Checked here rather than in the schema because it depends on STORAGE; same message shape.
  if (!raw.S3_BUCKET) {
    throw new Error(
      'Invalid configuration in the environment:\n  S3_BUCKET: required when STORAGE=s3',
    );
  }
  return {
    kind: 's3',
    bucket: raw.S3_BUCKET,
    region: raw.S3_REGION,
    endpoint: raw.S3_ENDPOINT,
    forcePathStyle: raw.S3_FORCE_PATH_STYLE,
  };
}
