// The only reader of process.env. Every setting is validated once at start so a
// typo in a deployment fails loudly instead of running with a silent default.
import { isIP } from 'node:net';
import { availableParallelism } from 'node:os';
import { z } from 'zod';

// Decimal digits only: z.coerce.number() would read "" as 0 and "0x1F90" as
// 8080, turning an empty or mistyped setting into a silent value.
const wholeNumber = (min: number, max = Number.MAX_SAFE_INTEGER) =>
  z.string().regex(/^\d+$/, 'expected a whole number written in decimal digits').transform(Number).pipe(z.number().int().min(min).max(max));

const positiveInt = (fallback: number) => wholeNumber(1).default(fallback);

const ConfigSchema = z.object({
  PORT: wholeNumber(0, 65535).default(8080),
  HOST: z.string().min(1).default('127.0.0.1'),
  // A file path, or a postgres:// URL; any other scheme is a typo, not a file name.
  AUDIT_DB: z
    .string()
    .min(1)
    .refine((v) => !/^[a-z][a-z0-9+.-]*:\/\//i.test(v) || /^postgres(ql)?:\/\//i.test(v), 'expected an SQLite file path or a postgres:// URL')
    .default('./data/audit.sqlite'),
  API_KEYS_FILE: z.string().min(1).optional(),
  // A team's agreed defaults for ranking (README: team policy); none: the built-in default.
  POLICY_FILE: z.string().min(1).optional(),
  // 'digest' keeps only the SHA-256 of each request in the audit record, for
  // data too sensitive to store; such records cannot be replayed.
  AUDIT_REQUESTS: z.enum(['full', 'digest']).default('full'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  // 32 MiB holds about two million numbers as JSON: real data sets, not toy ones.
  BODY_LIMIT_BYTES: positiveInt(32 * 1024 * 1024),
  // Every request is priced from its shape before anything is allocated
  // (src/core/pricing). Work in estimated multiply-adds: 1e10 is some 25 s of
  // one core at the ~2.5 ns each the quiet build machine's fit figures imply
  // (scripts/bench-pricing.ts prints the rate; ~25 ns under heavy shared load).
  MAX_REQUEST_WORK: positiveInt(10_000_000_000),
  // Estimated peak working memory of one request (designs, factorisations,
  // the search's swept matrices); every worker may hold this much at once.
  MAX_REQUEST_MEMORY_BYTES: positiveInt(512 * 1024 * 1024),
  // A hard cap on one model's design columns, whatever the rows: a product of
  // text factors multiplies their level counts.
  MAX_DESIGN_COLUMNS: positiveInt(2000),
  // The answer's JSON, which the audit record keeps beside the request (itself
  // bounded by BODY_LIMIT_BYTES): 16 MiB is some 100,000 predictions.
  MAX_RESULT_BYTES: positiveInt(16 * 1024 * 1024),
  // The compute pool: worker threads (default one per core), requests that may
  // wait for one (beyond those running), and the compute time one request may use.
  COMPUTE_WORKERS: wholeNumber(1, 256).default(availableParallelism()),
  COMPUTE_QUEUE_LENGTH: wholeNumber(0).default(8),
  COMPUTE_DEADLINE_MS: positiveInt(60_000),
  // Comparisons priced at or below this much work are computed on the main
  // thread, where a worker round trip would cost more than the work (about
  // 12 ms of one core: the demo's five models are half of it). 0: everything in the pool.
  COMPUTE_INLINE_WORK: wholeNumber(0).default(5_000_000),
  // Run the worked examples once at start (src/http/warm-up.ts) so the first
  // caller does not pay for compiling the code: on by default in a deployment.
  COMPUTE_WARM_UP: z.enum(['on', 'off']).default('on'),
  // POST /v1/summaries streams rows and keeps only their summary, so its body
  // may be far larger than any JSON request: 2 GiB holds ~10^7 rows of NDJSON.
  SUMMARY_BODY_LIMIT_BYTES: positiveInt(2 * 1024 * 1024 * 1024),
  // Exact origins ("https://dash.example.org"), comma-separated; none by default,
  // so no browser page elsewhere can read a reply until someone decides it may.
  CORS_ORIGINS: z.string().default('').transform((s, ctx) => {
    const origins = s.split(',').map((o) => o.trim()).filter((o) => o.length > 0);
    for (const o of origins) {
      if (!/^https?:\/\/[^/\s?#]+$/.test(o)) ctx.addIssue({ code: 'custom', message: `"${o}" is not an origin (scheme://host[:port], no path)` });
    }
    return origins;
  }),
  // Deepest nesting of arrays and objects in a JSON body. Requests nest six
  // levels today; a body nested a million deep would otherwise become a million
  // objects before any check could see it.
  JSON_MAX_DEPTH: wholeNumber(2, 10_000).default(64),
  // Failed authentications (no key, a malformed header, an unknown key) one
  // client address may make per minute before every keyed request from it is
  // answered 429 for the rest of the minute. A dashboard polling with a stale
  // key stays well under; a guesser is slowed to a trickle.
  AUTH_FAILURES_PER_MINUTE: positiveInt(30),
  // POST /v1/summaries in flight at once per caller (API key, or client
  // address when open): each holds a socket and a share of the CPU for as long
  // as its rows stream.
  SUMMARY_UPLOADS_PER_CALLER: positiveInt(2),
  // The proxies in front of the service (addresses, CIDR ranges, or loopback,
  // linklocal, uniquelocal), comma-separated; none by default. Requests from
  // them are taken to be from the address in X-Forwarded-For, so the limits
  // per client address (AUTH_FAILURES_PER_MINUTE, and RATE_LIMIT_PER_MINUTE
  // when open) count each client rather than the proxy: without it every
  // caller behind a proxy shares one address, and one bad key locks them all out.
  TRUST_PROXY: z.string().default('').transform((s, ctx) => {
    const entries = s.split(',').map((e) => e.trim()).filter((e) => e.length > 0);
    for (const e of entries) {
      const [address, prefix, ...rest] = e.split('/');
      const family = isIP(address);
      const prefixOk = prefix === undefined || (/^\d{1,3}$/.test(prefix) && Number(prefix) <= (family === 6 ? 128 : 32));
      if (!['loopback', 'linklocal', 'uniquelocal'].includes(e) && (family === 0 || !prefixOk || rest.length > 0)) {
        ctx.addIssue({ code: 'custom', message: `"${e}" is not an address, a CIDR range, or loopback, linklocal or uniquelocal` });
      }
    }
    return entries;
  }),
  // Per API key (per client address when no keys are configured). 600/min is ten
  // a second: far above a dashboard, far below what one core can fit.
  RATE_LIMIT_PER_MINUTE: positiveInt(600),
  // Time to receive a whole request, headers and body (slow senders hold sockets).
  REQUEST_TIMEOUT_MS: positiveInt(60_000),
  // Shed load with 503 once the event loop lags this much; 0 turns shedding off.
  EVENT_LOOP_MAX_DELAY_MS: wholeNumber(0).default(1000),
  // On SIGTERM: how long requests in flight may take before the process is stopped.
  SHUTDOWN_GRACE_MS: positiveInt(20_000),
  // A comparison's answer is checked against its response schema before it is
  // recorded (http/representable.ts); 'on' checks it a second time as it is
  // written out. Tests and the demo run with it on (defaultConfig).
  RESPONSE_SCHEMA_CHECK: z.enum(['on', 'off']).default('off'),
});

export type Config = Readonly<{
  port: number;
  host: string;
  auditDb: string;
  apiKeysFile: string | undefined;
  policyFile: string | undefined;
  auditRequests: 'full' | 'digest';
  logLevel: z.infer<typeof ConfigSchema>['LOG_LEVEL'];
  bodyLimitBytes: number;
  maxRequestWork: number;
  maxRequestMemoryBytes: number;
  maxDesignColumns: number;
  maxResultBytes: number;
  computeWorkers: number;
  computeQueueLength: number;
  computeDeadlineMs: number;
  computeInlineWork: number;
  computeWarmUp: boolean;
  summaryBodyLimitBytes: number;
  corsOrigins: ReadonlyArray<string>;
  trustProxy: ReadonlyArray<string>;
  jsonMaxDepth: number;
  authFailuresPerMinute: number;
  summaryUploadsPerCaller: number;
  rateLimitPerMinute: number;
  requestTimeoutMs: number;
  eventLoopMaxDelayMs: number;
  /** Re-check a comparison's answer against its response schema as it is sent (tests: on). */
  responseSchemaCheck: boolean;
  shutdownGraceMs: number;
}>;

export class ConfigError extends Error {}

/** Settings that no longer exist: set, they would be ignored, so the service refuses to start and says what replaced them. */
const RETIRED: Record<string, string> = {
  MAX_WORK_CELLS: 'MAX_WORK_CELLS (rows × design columns) was replaced by MAX_REQUEST_WORK (estimated multiply-adds, which grow with the square of the design columns) and MAX_REQUEST_MEMORY_BYTES; remove it and set those instead',
};

export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const retired = Object.keys(RETIRED).filter((name) => env[name] !== undefined);
  if (retired.length > 0) throw new ConfigError(`invalid configuration: ${retired.map((name) => RETIRED[name]).join('; ')}`);
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`invalid configuration: ${lines.join('; ')}`);
  }
  const c = parsed.data;
  return Object.freeze({
    port: c.PORT,
    host: c.HOST,
    auditDb: c.AUDIT_DB,
    apiKeysFile: c.API_KEYS_FILE,
    policyFile: c.POLICY_FILE,
    auditRequests: c.AUDIT_REQUESTS,
    logLevel: c.LOG_LEVEL,
    bodyLimitBytes: c.BODY_LIMIT_BYTES,
    maxRequestWork: c.MAX_REQUEST_WORK,
    maxRequestMemoryBytes: c.MAX_REQUEST_MEMORY_BYTES,
    maxDesignColumns: c.MAX_DESIGN_COLUMNS,
    maxResultBytes: c.MAX_RESULT_BYTES,
    computeWorkers: c.COMPUTE_WORKERS,
    computeQueueLength: c.COMPUTE_QUEUE_LENGTH,
    computeDeadlineMs: c.COMPUTE_DEADLINE_MS,
    computeInlineWork: c.COMPUTE_INLINE_WORK,
    computeWarmUp: c.COMPUTE_WARM_UP === 'on',
    summaryBodyLimitBytes: c.SUMMARY_BODY_LIMIT_BYTES,
    corsOrigins: Object.freeze(c.CORS_ORIGINS),
    trustProxy: Object.freeze(c.TRUST_PROXY),
    jsonMaxDepth: c.JSON_MAX_DEPTH,
    authFailuresPerMinute: c.AUTH_FAILURES_PER_MINUTE,
    summaryUploadsPerCaller: c.SUMMARY_UPLOADS_PER_CALLER,
    rateLimitPerMinute: c.RATE_LIMIT_PER_MINUTE,
    requestTimeoutMs: c.REQUEST_TIMEOUT_MS,
    eventLoopMaxDelayMs: c.EVENT_LOOP_MAX_DELAY_MS,
    shutdownGraceMs: c.SHUTDOWN_GRACE_MS,
    responseSchemaCheck: c.RESPONSE_SCHEMA_CHECK === 'on',
  });
}

/**
 * Defaults for tests and the demo: what a fresh deployment would run with, answers re-checked against
 * their schema, and no warm-up (hundreds of apps start in the tests; each would compile the examples).
 */
export function defaultConfig(overrides: Partial<Config> = {}): Config {
  return Object.freeze({ ...loadConfig({}), responseSchemaCheck: true, computeWarmUp: false, ...overrides });
}
