import { z } from 'zod';

/** The only reader of process.env: validated once, at start-up. */
export const ConfigSchema = z.object({
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, 'a postgres:// connection URL')
    .optional(),
  RATEPROOF_DATA_DIR: z.string().min(1).default('./data'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.string().trim().regex(/^\d+$/, 'a port number').transform(Number).pipe(z.number().max(65535)).default(3000),
  /** Creates courses and their first instructors; at least 24 characters when set. */
  RATEPROOF_ADMIN_TOKEN: z.string().min(24, 'at least 24 characters').optional(),
  /** Lets any address read /metrics with it; unset, /metrics answers only this machine. At least 24 characters when set. */
  RATEPROOF_METRICS_TOKEN: z.string().min(24, 'at least 24 characters').optional(),
  RATEPROOF_BODY_LIMIT_MB: z.string().trim().regex(/^\d+(\.\d+)?$/, 'a number of megabytes').transform(Number).pipe(z.number().positive().max(100)).default(5),
  /** `always` behind a proxy that ends TLS: the session cookie is then marked Secure although the service hears http. */
  RATEPROOF_SECURE_COOKIE: z.enum(['auto', 'always']).default('auto'),
  /** Worker threads for checking and drawing; 0 does that work in the service's own thread. Default: one per core. */
  RATEPROOF_WORKERS: z.string().trim().regex(/^\d+$/, 'a whole number of threads').transform(Number).pipe(z.number().max(64)).optional(),
  /** Sections of more submissions than this get their ZIP and summary from a job (202, then the stored file); default 200. */
  RATEPROOF_BIG_SECTION: z.string().trim().regex(/^\d+$/, 'a whole number of students').transform(Number).pipe(z.number().max(1_000_000)).optional(),
  /** Access-code sign-ins one address may try in a minute; default 10. */
  RATEPROOF_CODE_TRIES: z.string().trim().regex(/^\d+$/, 'a whole number of tries').transform(Number).pipe(z.number().min(1).max(100_000)).optional(),
  /** Proxies in front of the service whose X-Forwarded-For to believe (docker compose: 1, its Caddy); unset, none. */
  RATEPROOF_PROXY_HOPS: z.string().trim().regex(/^\d+$/, 'a whole number of proxies').transform(Number).pipe(z.number().min(1).max(10)).optional(),
  /** Seconds before grade passback tries a platform again, doubling each time; default 30. */
  RATEPROOF_PASSBACK_RETRY_SECONDS: z.string().trim().regex(/^\d+$/, 'a whole number of seconds').transform(Number).pipe(z.number().min(1).max(3600)).optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export interface Config {
  databaseUrl?: string;
  dataDir: string;
  host: string;
  port: number;
  adminToken?: string;
  /** Who may read /metrics from another machine (a bearer token); unset, only this machine may. */
  metricsToken?: string;
  bodyLimitBytes: number;
  logLevel: z.infer<typeof ConfigSchema>['LOG_LEVEL'];
  /** Worker threads for checking and drawing (0: the service's own thread); unset: one per core. */
  workers?: number;
  /** Mark the session cookie Secure on every request (`always`), or only on requests that came over TLS. */
  secureCookie?: 'auto' | 'always';
  /** Sections of more submissions than this get their ZIP and summary drawn by a job; unset: 200. */
  bigSection?: number;
  /** Access-code sign-ins one address may try in a minute (guessing codes is slowed); unset: 10. */
  codeTriesPerMinute?: number;
  /**
   * How many proxies in front of the service to believe about the client's address (X-Forwarded-For)
   * and protocol: the address the code sign-in's limit counts by. Unset, the connection's own address.
   */
  proxyHops?: number;
  /** First wait before grade passback tries a platform again (default: the passback queue's own). */
  passbackRetrySeconds?: number;
  /** What this process does (`rateproof serve` flags): serve requests and work jobs (the default), or one of them. */
  role?: ProcessRole;
}

/** `both`: requests and jobs; `requests`: --no-jobs; `jobs`: --jobs-only (no HTTP). */
export type ProcessRole = 'both' | 'requests' | 'jobs';

const ROLE_FLAGS: Record<string, ProcessRole> = { '--no-jobs': 'requests', '--jobs-only': 'jobs' };

/**
 * The process's role from `rateproof serve`'s flags. Splitting needs a PostgreSQL server: the embedded
 * database is one process's, which must then do both.
 */
export function processRole(flags: string[], config: Pick<Config, 'databaseUrl'>): ProcessRole {
  const unknown = flags.find((f) => !(f in ROLE_FLAGS));
  if (unknown !== undefined) throw new ConfigError(`unexpected argument '${unknown}' (serve takes --no-jobs or --jobs-only)`);
  const roles = new Set(flags.map((f) => ROLE_FLAGS[f]));
  if (roles.size > 1) throw new ConfigError('--no-jobs and --jobs-only exclude each other');
  const role = roles.values().next().value ?? 'both';
  if (role !== 'both' && !config.databaseUrl) throw new ConfigError(`${flags[0]} needs DATABASE_URL: on the embedded database one process serves requests and works jobs`);
  return role;
}

export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
  // Empty variables count as unset, as a shell `VAR=` usually means.
  const present = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v !== ''));
  const parsed = ConfigSchema.safeParse(present);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  return {
    databaseUrl: c.DATABASE_URL,
    dataDir: c.RATEPROOF_DATA_DIR,
    host: c.HOST,
    port: c.PORT,
    adminToken: c.RATEPROOF_ADMIN_TOKEN,
    metricsToken: c.RATEPROOF_METRICS_TOKEN,
    bodyLimitBytes: Math.round(c.RATEPROOF_BODY_LIMIT_MB * 1024 * 1024),
    logLevel: c.LOG_LEVEL,
    secureCookie: c.RATEPROOF_SECURE_COOKIE,
    workers: c.RATEPROOF_WORKERS,
    bigSection: c.RATEPROOF_BIG_SECTION,
    codeTriesPerMinute: c.RATEPROOF_CODE_TRIES,
    proxyHops: c.RATEPROOF_PROXY_HOPS,
    passbackRetrySeconds: c.RATEPROOF_PASSBACK_RETRY_SECONDS,
  };
}
