// Configuration is read once and strictly: an empty or mistyped setting fails
// at start with the variable named, instead of running with a silent value.
import { availableParallelism } from 'node:os';
import t from 'tap';
import { loadConfig, ConfigError } from '../src/config.ts';

const refused = (env: Record<string, string>) => {
  try {
    loadConfig(env);
    return null;
  } catch (error) {
    return error instanceof ConfigError ? error.message : String(error);
  }
};

t.test('defaults are those of the README configuration table', async (t) => {
  const c = loadConfig({});
  t.match(c, { port: 8080, host: '127.0.0.1', auditDb: './data/audit.sqlite', auditRequests: 'full', logLevel: 'info', bodyLimitBytes: 33554432, rateLimitPerMinute: 600, requestTimeoutMs: 60000, eventLoopMaxDelayMs: 1000, shutdownGraceMs: 20000, jsonMaxDepth: 64, authFailuresPerMinute: 30, summaryUploadsPerCaller: 2 });
  t.match(c, {
    maxRequestWork: 10_000_000_000, maxRequestMemoryBytes: 536870912, maxDesignColumns: 2000, maxResultBytes: 16777216,
    computeWorkers: availableParallelism(), computeQueueLength: 8, computeDeadlineMs: 60000, computeInlineWork: 5_000_000,
  });
});

t.test('the compute and pricing settings are decimal whole numbers, named when wrong', async (t) => {
  t.match(refused({ MAX_REQUEST_WORK: '1e10' }), /MAX_REQUEST_WORK/);
  t.match(refused({ MAX_REQUEST_MEMORY_BYTES: '0x20000000' }), /MAX_REQUEST_MEMORY_BYTES/);
  t.match(refused({ MAX_DESIGN_COLUMNS: '0' }), /MAX_DESIGN_COLUMNS/);
  t.match(refused({ MAX_RESULT_BYTES: '' }), /MAX_RESULT_BYTES/);
  t.match(refused({ COMPUTE_WORKERS: '0' }), /COMPUTE_WORKERS/);
  t.match(refused({ COMPUTE_DEADLINE_MS: '-5' }), /COMPUTE_DEADLINE_MS/);
  t.match(refused({ COMPUTE_QUEUE_LENGTH: '2.5' }), /COMPUTE_QUEUE_LENGTH/);
  t.equal(refused({ COMPUTE_QUEUE_LENGTH: '0', COMPUTE_INLINE_WORK: '0', COMPUTE_WORKERS: '3' }), null, '0 queue and 0 inline work are meaningful');
});

t.test('MAX_WORK_CELLS, replaced by the cost model, is refused with what replaced it rather than ignored', async (t) => {
  const message = refused({ MAX_WORK_CELLS: '60000000' });
  t.match(message, /MAX_WORK_CELLS/);
  t.match(message, /MAX_REQUEST_WORK/);
  t.match(message, /MAX_REQUEST_MEMORY_BYTES/);
});

t.test('numbers are decimal digits: empty, hexadecimal and exponent forms are refused by name', async (t) => {
  t.match(refused({ PORT: '' }), /PORT/);
  t.match(refused({ PORT: '0x1F90' }), /PORT/);
  t.match(refused({ SHUTDOWN_GRACE_MS: '1e3' }), /SHUTDOWN_GRACE_MS/);
  t.match(refused({ EVENT_LOOP_MAX_DELAY_MS: '' }), /EVENT_LOOP_MAX_DELAY_MS/);
  t.equal(refused({ PORT: '9090' }), null);
  t.match(refused({ JSON_MAX_DEPTH: '0x40' }), /JSON_MAX_DEPTH/);
  t.match(refused({ JSON_MAX_DEPTH: '1' }), /JSON_MAX_DEPTH/, 'a request nests at least two levels');
  t.match(refused({ AUTH_FAILURES_PER_MINUTE: '0' }), /AUTH_FAILURES_PER_MINUTE/);
  t.match(refused({ SUMMARY_UPLOADS_PER_CALLER: '' }), /SUMMARY_UPLOADS_PER_CALLER/);
});

t.test('TRUST_PROXY lists addresses, CIDR ranges and the named ranges; anything else is refused by name', async (t) => {
  t.same(loadConfig({ TRUST_PROXY: '10.0.0.7, 172.16.0.0/12,uniquelocal, ::1, fd00::/8' }).trustProxy, ['10.0.0.7', '172.16.0.0/12', 'uniquelocal', '::1', 'fd00::/8']);
  t.same(loadConfig({}).trustProxy, [], 'none by default');
  t.match(refused({ TRUST_PROXY: 'nginx' }), /TRUST_PROXY: "nginx" is not an address/);
  t.match(refused({ TRUST_PROXY: '10.0.0.0/33' }), /TRUST_PROXY/);
  t.match(refused({ TRUST_PROXY: '10.0.0.0/8/8' }), /TRUST_PROXY/);
});

t.test('AUDIT_DB is a file path or a postgres:// URL; another scheme is a typo', async (t) => {
  t.match(refused({ AUDIT_DB: 'postgress://db.internal/audit' }), /AUDIT_DB/);
  t.equal(refused({ AUDIT_DB: 'postgresql://u@h/d' }), null);
  t.equal(refused({ AUDIT_DB: '/var/lib/parsimetry/audit.sqlite' }), null);
});
