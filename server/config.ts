import { randomBytes } from 'node:crypto';
import { isIP } from 'node:net';
import path from 'node:path';
import { z } from 'zod';
import { controlCharacterPattern } from './schemas/common';

const booleanFromEnv = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((value) => value === 'true' || value === '1' || value === 'yes');

/** Express's names for whole address ranges, accepted beside addresses and CIDR blocks. */
const proxyRangeNames = new Set(['loopback', 'linklocal', 'uniquelocal']);

function isProxyAddress(entry: string): boolean {
  if (proxyRangeNames.has(entry)) return true;
  const [address = '', prefix, ...rest] = entry.split('/');
  const family = isIP(address);
  if (!family || rest.length > 0) return false;
  if (prefix === undefined) return true;
  const bits = Number(prefix);
  return /^\d{1,3}$/.test(prefix) && bits <= (family === 4 ? 32 : 128);
}

/**
 * `true` believes exactly one proxy hop; a comma-separated list believes X-Forwarded-* only
 * from those addresses (safer: a client reaching the app directly cannot spoof its address).
 */
const trustProxyFromEnv = z.union([
  booleanFromEnv,
  z
    .string()
    .transform((value) =>
      value
        .split(',')
        .map((entry) => entry.trim())
        .filter((entry) => entry.length > 0),
    )
    .refine((entries) => entries.length > 0 && entries.every(isProxyAddress), {
      error:
        'Use true, false, or a comma-separated list of proxy addresses (10.0.0.5, 10.0.0.0/24, loopback).',
    }),
]);

/**
 * Text printed on invoices and written into delivered files' metadata: one line, no control
 * characters (a tab or a stray escape from a .env file would land in the PDF and the CSV).
 */
function printedLine(min: number, max: number) {
  return z
    .string()
    .min(min)
    .max(max)
    .refine((text) => !controlCharacterPattern.test(text), {
      message: 'Write it on one line, without tabs or other control characters.',
    });
}

/** Every setting the server reads from the environment, with its default. */
export const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  PUBLIC_URL: z.url().optional(),
  DATABASE_URL: z.url().optional(),
  SMTP_URL: z.url().optional(),
  /** The studio's sending address, bare or as `Name <address>`; the name defaults to STUDIO_NAME. */
  MAIL_FROM: z
    .string()
    .trim()
    .regex(/^(?:[^<>]*<[^\s<>@]+@[^\s<>@]+>|[^\s<>@]+@[^\s<>@]+)$/, 'an address or Name <address>')
    .default('bookings@northlight.example'),
  /** Where replies go (Reply-To, and the calendar organiser); without it invitations ask for none. */
  MAIL_REPLY_TO: z.email().optional(),
  SESSION_TTL_HOURS: z.coerce.number().positive().default(168),
  INVITATION_LINK_TTL_HOURS: z.coerce.number().positive().default(168),
  SIGN_IN_LINK_TTL_MINUTES: z.coerce.number().positive().default(30),
  SET_PASSWORD_LINK_TTL_HOURS: z.coerce.number().positive().default(72),
  PASSWORD_RESET_TTL_MINUTES: z.coerce.number().positive().default(60),
  RATE_LIMIT_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  RATE_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(30),
  /** Wrong passwords (or link requests) one address may make for one e-mail before waiting. */
  SIGN_IN_FREE_ATTEMPTS: z.coerce.number().int().min(1).max(100).default(5),
  /** The longest wait the back-off asks of one address and e-mail pair. */
  SIGN_IN_MAX_WAIT_MINUTES: z.coerce.number().positive().max(1440).default(15),
  TRUST_PROXY: trustProxyFromEnv.default(false),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  LIKENESS_DATA_DIR: z.string().min(1).default('.data'),
  PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
  LOAD_DEMO: booleanFromEnv.default(true),
  /** all: web and jobs in one process (npm start); web: HTTP and console events; worker: jobs. */
  PROCESS_ROLE: z.enum(['all', 'web', 'worker']).default('all'),
  /** How long a stopping process lets open requests finish before it cuts them. */
  DRAIN_SECONDS: z.coerce.number().min(0).max(600).default(25),
  /** A worker answers /api/health and /api/ready on this port when it is set. */
  HEALTH_PORT: z.coerce.number().int().min(0).max(65535).optional(),
  /** Where tus keeps files still arriving; every web process of one site must share it. */
  UPLOAD_SPOOL_DIR: z.string().min(1).optional(),
  /** Statements run often are prepared per connection; off behind a pooler that cannot. */
  DATABASE_PREPARED_STATEMENTS: booleanFromEnv.default(true),
  /** `npm run serve` applies pending migrations first (under PostgreSQL's advisory lock). */
  MIGRATE_ON_START: booleanFromEnv.default(true),
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
  STUDIO_NAME: printedLine(1, 100).default('Northlight Portrait Co.'),
  /** Printed under the studio's name on invoices (one line; commas as you like). */
  STUDIO_ADDRESS: printedLine(0, 200).default('12 Lantern Yard, Leeds'),
  /** The studio's tax or VAT number, printed on invoices when set. */
  STUDIO_TAX_ID: printedLine(0, 40).default(''),
  PROOF_URL_TTL_MINUTES: z.coerce.number().int().min(1).max(1440).default(60),
  /** A person gets at most one booking reminder per day within this many hours. */
  REMINDER_COOLDOWN_HOURS: z.coerce.number().min(0).max(720).default(24),
});

export type RawConfig = z.infer<typeof configSchema>;

export interface AppConfig {
  env: RawConfig['NODE_ENV'];
  publicUrl: string;
  /** The From header: the studio's name and sending address. */
  mailFrom: { name: string; address: string };
  /** Reply-To of every message and the calendar organiser; null when no reply is wanted. */
  mailReplyTo: string | null;
  studioName: string;
  studioAddress: string;
  studioTaxId: string;
  /** false, one hop (true), or the proxy addresses whose X-Forwarded-* headers are believed. */
  trustProxy: boolean | string[];
  logLevel: RawConfig['LOG_LEVEL'];
  sessionTtlMs: number;
  invitationLinkTtlMs: number;
  signInLinkTtlMs: number;
  setPasswordLinkTtlMs: number;
  passwordResetTtlMs: number;
  rateLimit: { windowMs: number; perAddress: number };
  /** The growing wait per address and e-mail pair (server/lib/sign-in-backoff.ts). */
  signInBackoff: { freeAttempts: number; firstDelayMs: number; maxDelayMs: number };
  storage: StorageSettings;
  /** Files still arriving live in `folder` (tus); no file over maxBytes or maxPixels is kept. */
  uploads: { folder: string; maxBytes: number; maxPixels: number };
  /** Proof previews are served through signed URLs that expire. */
  proofUrls: { secret: string; ttlMs: number };
  reminderCooldownMs: number;
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
    mailFrom: parseMailFrom(raw.MAIL_FROM, raw.STUDIO_NAME),
    mailReplyTo: raw.MAIL_REPLY_TO ?? null,
    studioName: raw.STUDIO_NAME,
    studioAddress: raw.STUDIO_ADDRESS,
    studioTaxId: raw.STUDIO_TAX_ID,
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
    },
    signInBackoff: {
      freeAttempts: raw.SIGN_IN_FREE_ATTEMPTS,
      firstDelayMs: 2000,
      maxDelayMs: raw.SIGN_IN_MAX_WAIT_MINUTES * MINUTE,
    },
    storage: toStorageSettings(raw),
    uploads: {
      folder: path.resolve(
        raw.UPLOAD_SPOOL_DIR ?? path.join(raw.LIKENESS_DATA_DIR, 'uploads-in-flight'),
      ),
      maxBytes: raw.UPLOAD_MAX_MB * 1_000_000,
      maxPixels: raw.UPLOAD_MAX_MEGAPIXELS * 1_000_000,
    },
    proofUrls: {
      // Without a configured secret each process makes its own: a restart only means the
      // proofs page asks for fresh URLs, which it does on every load anyway.
      secret: raw.URL_SIGNING_SECRET ?? randomBytes(32).toString('hex'),
      ttlMs: raw.PROOF_URL_TTL_MINUTES * MINUTE,
    },
    reminderCooldownMs: raw.REMINDER_COOLDOWN_HOURS * HOUR,
  };
}

function parseMailFrom(value: string, studioName: string): { name: string; address: string } {
  const named = /^(.*)<([^<>]+)>$/.exec(value);
  if (!named) return { name: studioName, address: value };
  const name = named[1]!.trim().replace(/^"(.*)"$/, '$1');
  return { name: name || studioName, address: named[2]!.trim() };
}

/** What the mailer needs to send as the studio: who it is from, where replies go, the sign-off. */
export function mailIdentity(config: AppConfig) {
  return { from: config.mailFrom, replyTo: config.mailReplyTo, signature: config.studioName };
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
