/** Server configuration, parsed once from the environment. */
import { z } from 'zod';

const bool = z
  .enum(['1', '0', 'true', 'false', 'yes', 'no'])
  .transform((v) => v === '1' || v === 'true' || v === 'yes');

const envSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  HOST: z.string().default('127.0.0.1'),
  DATABASE_URL: z.string().url().optional(),
  /** Public origin the browser uses; sign-in cookies and trusted origins follow it. */
  PUBLIC_URL: z.string().url().optional(),
  AUTH_SECRET: z.string().min(32).optional(),
  /** Sign-in attempts allowed per client address per minute. */
  AUTH_SIGNIN_PER_MINUTE: z.coerce.number().int().min(1).max(10_000).default(10),
  /** Failed sign-ins allowed per account (e-mail address) in 15 minutes, from any number of addresses. */
  AUTH_SIGNIN_FAILURES_PER_ACCOUNT: z.coerce.number().int().min(1).max(10_000).default(10),
  JSON_LIMIT: z.string().default('1mb'),
  UPLOAD_LIMIT_MB: z.coerce.number().positive().max(1_000_000).default(512),
  STORAGE_DRIVER: z.enum(['disk', 's3']).default('disk'),
  STORAGE_DIR: z.string().optional(),
  S3_ENDPOINT: z.string().url().optional(),
  S3_BUCKET: z.string().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  SMTP_HOST: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Loftline <no-reply@loftline.example>'),
  /** Days a team invitation stays valid. */
  INVITATION_DAYS: z.coerce.number().positive().max(90).default(7),
  WORKERS: z.coerce.number().int().min(0).max(16).default(1),
  /** Worker threads for DEM decoding and analyses in this process; 0 runs them on the main thread. */
  TERRAIN_THREADS: z.coerce.number().int().min(0).max(16).default(1),
  /**
   * Start the terrain threads from their entry compiled to one plain JavaScript module (about 6 % faster passes)
   * instead of through the TypeScript loader; if compiling fails the threads run through the loader. On by default:
   * the memory figure that once kept it off (`npm run bench:api`) swings as much with the loader (0.9–1.45 between
   * runs of the same code), and a long run shows no growth with analyses.
   */
  TERRAIN_THREADS_COMPILED: bool.default(true),
  /** Nice value of the terrain threads (0 normal … 19 lowest): analyses yield the CPU to API requests. */
  ANALYSIS_NICE: z.coerce.number().int().min(0).max(19).default(10),
  /** Directory of the NTv2 datum-shift grids some CRSs need (BETA2007.gsb, …; Debian proj-data puts them here). */
  DATUM_GRID_DIR: z.string().min(1).default('/usr/share/proj'),
  /** Largest elevation grid an upload may declare, in pixels (2^27 = 512 MiB of float32 heights). */
  DEM_MAX_PIXELS: z.coerce.number().int().min(1).max(2 ** 30).default(2 ** 27),
  /** Longest one terrain task (reading an upload, one analysis) may run before its thread is stopped and replaced. */
  TERRAIN_TASK_SECONDS: z.coerce.number().positive().max(86_400).default(300),
  /** Least time between two live-coverage runs of one version while it is flown (new photos wait for the next run). */
  LIVE_COVERAGE_SECONDS: z.coerce.number().min(0).max(600).default(5),
  /** Crash debris (partial uploads, stored grids without a site) older than this is removed. */
  ORPHAN_GRACE_MINUTES: z.coerce.number().positive().max(10_080).default(60),
  /** How often storage is swept for crash debris (also once at start). */
  ORPHAN_SWEEP_MINUTES: z.coerce.number().positive().max(10_080).default(30),
  /** Retries of an analysis job that stopped without finishing (a crashed or killed worker). */
  ANALYSIS_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(3),
  /** Backstop behind the heartbeat: an analysis job still active after this long is failed by the queue itself; keep it above the longest run. */
  ANALYSIS_EXPIRE_SECONDS: z.coerce.number().int().min(1).max(86_400).default(900),
  /** How often a running analysis records that it is alive (and how often each process looks for analyses that stopped). */
  ANALYSIS_HEARTBEAT_SECONDS: z.coerce.number().positive().max(60).default(5),
  /** A running analysis with no heartbeat for this long lost its worker (crash, kill) and is handed back for retry. */
  ANALYSIS_STALE_SECONDS: z.coerce.number().positive().max(45).default(30),
  /** How often the job queue looks for lost jobs (pg-boss maintenance), and how often idle workers poll. */
  JOBS_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  JOBS_POLL_SECONDS: z.coerce.number().min(0.5).max(60).default(2),
  /** Name of the analysis queue; processes that share a database but should not share work use different names. */
  ANALYSIS_QUEUE: z.string().regex(/^[a-z0-9][a-z0-9._-]{0,40}$/).default('plan-analysis'),
  DEV_OUTBOX: bool.optional(),
  /** Name of the mail queue; like ANALYSIS_QUEUE, processes that should not share mail use different names. */
  MAIL_QUEUE: z.string().regex(/^[a-z0-9][a-z0-9._-]{0,40}$/).default('mail'),
  /** 0: this process queues mail but does not send it (another process on the same database does). */
  MAIL_SEND: bool.optional(),
  /** Retries of a mail whose send failed (backoff from 30 s). */
  MAIL_RETRY_LIMIT: z.coerce.number().int().min(0).max(20).default(5),
  NODE_ENV: z.string().default('development'),
});

type Env = z.infer<typeof envSchema>;

export interface Config {
  port: number;
  host: string;
  databaseUrl: string;
  publicUrl: string;
  authSecret: string;
  signInPerMinute: number;
  signInFailuresPerAccount: number;
  jsonLimit: string;
  uploadLimitBytes: number;
  webDist: string | null;
  env: Env;
}

/** Parse the environment; throws a readable message listing each bad variable. */
export function parseEnv(source: NodeJS.ProcessEnv): Env {
  const r = envSchema.safeParse(source);
  if (!r.success) {
    const lines = r.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Configuration error:\n${lines.join('\n')}`);
  }
  return r.data;
}

/** Turn the parsed environment plus what start-up resolved (database, secret, web build) into the server config. */
export function buildConfig(env: Env, resolved: { databaseUrl: string; authSecret: string; webDist: string | null; port?: number }): Config {
  const port = resolved.port ?? env.PORT;
  return {
    port,
    host: env.HOST,
    databaseUrl: env.DATABASE_URL ?? resolved.databaseUrl,
    publicUrl: env.PUBLIC_URL ?? `http://${env.HOST === '0.0.0.0' ? '127.0.0.1' : env.HOST}:${port}`,
    authSecret: env.AUTH_SECRET ?? resolved.authSecret,
    signInPerMinute: env.AUTH_SIGNIN_PER_MINUTE,
    signInFailuresPerAccount: env.AUTH_SIGNIN_FAILURES_PER_ACCOUNT,
    jsonLimit: env.JSON_LIMIT,
    uploadLimitBytes: Math.round(env.UPLOAD_LIMIT_MB * 1024 * 1024),
    webDist: resolved.webDist,
    env,
  };
}
