// The comparison request path over real sockets against a bare fastify route
// that parses the same body and answers a few bytes: the ratio says how much of
// the socket-and-parse ceiling the service keeps while it fits, ranks, records
// durably and answers. The two alternate within one run (bare, service, bare,
// service, ...) so both see the same machine; the ratio is taken per round and
// its median printed. autocannon fires from a worker thread so the load
// generator does not share the servers' event loop.
//   npx tsx scripts/bench-http.ts [seconds per run, default 5] [rounds, default 3] [connections, default 10]
// With PARSIMETRY_TEST_PG_URL set, a PostgreSQL store is measured too (each in
// a schema of its own, dropped afterwards).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { randomBytes } from 'node:crypto';
import Fastify, { type FastifyInstance } from 'fastify';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import type { AuditStore } from '../src/audit/store.ts';
import { buildApp, computePoolFor } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';
import { dropBenchSchemas } from './bench-pg.ts';

// autocannon ships no type declarations; this is the part used here.
interface LoadResult { requests: { average: number }; '2xx': number; non2xx: number; errors: number; duration: number; latency: { p50: number; p99: number } }
const autocannon = createRequire(import.meta.url)('autocannon') as (options: Record<string, unknown>) => Promise<LoadResult>;

const seconds = Math.min(60, Number(process.argv[2] ?? 5));
const rounds = Math.min(20, Number(process.argv[3] ?? 3));
const connections = Math.min(64, Number(process.argv[4] ?? 10));

const bodies = [
  { name: '300 rows, 5 candidates', text: JSON.stringify(demoComparison(300)) },
  { name: 'demo (120 rows, 5 candidates)', text: JSON.stringify(demoComparison()) },
];

async function bareServer(): Promise<{ app: FastifyInstance; url: string }> {
  // fastify's own JSON parser and nothing else: the ceiling for a route that must read this body.
  const app = Fastify({ logger: false, bodyLimit: 64 * 2 ** 20 });
  app.post('/bare', async (request) => ({ keys: Object.keys(request.body as object).length }));
  const url = await app.listen({ host: '127.0.0.1', port: 0 });
  return { app, url: `${url}/bare` };
}

async function serviceServer(store: AuditStore, auditDb: string): Promise<{ app: FastifyInstance; url: string }> {
  // As production runs: answers written as plain JSON (RESPONSE_SCHEMA_CHECK=off), the compute pool
  // started with the service (src/server.ts) and closed with it.
  const config = defaultConfig({ auditDb, rateLimitPerMinute: 10_000_000, eventLoopMaxDelayMs: 0, responseSchemaCheck: false });
  const compute = computePoolFor(config);
  compute.start();
  const app = await buildApp({ config, store, logger: false, compute });
  app.addHook('onClose', async () => compute.close());
  const url = await app.listen({ host: '127.0.0.1', port: 0 });
  return { app, url: `${url}/v1/comparisons` };
}

interface Run { perSecond: number; p50: number; p99: number; bad: number }

async function fire(url: string, body: string, duration = seconds): Promise<Run> {
  const r = await autocannon({
    url, method: 'POST', body, headers: { 'content-type': 'application/json' }, connections, duration, workers: 1,
  });
  return { perSecond: r['2xx'] / seconds, p50: r.latency.p50, p99: r.latency.p99, bad: r.non2xx + r.errors };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const fmt = (run: Run) =>
  `${run.perSecond.toFixed(1).padStart(9)} /s  p50 ${String(run.p50).padStart(4)} ms  p99 ${String(run.p99).padStart(4)} ms${run.bad ? `  FAILED ${run.bad}` : ''}`;

async function measure(storeName: string, openStore: () => Promise<{ store: AuditStore; auditDb: string; done: () => Promise<void> }>) {
  const bare = await bareServer();
  for (const body of bodies) {
    const { store, auditDb, done } = await openStore();
    const service = await serviceServer(store, auditDb);
    // Warm both (JIT, lazy modules, the store's statements) before anything is counted.
    await fire(bare.url, body.text, 1);
    await fire(service.url, body.text, 1);
    const ratios: number[] = [];
    for (let round = 1; round <= rounds; round++) {
      const b = await fire(bare.url, body.text);
      const s = await fire(service.url, body.text);
      ratios.push(s.perSecond / b.perSecond);
      console.log(`${body.name.padEnd(30)} ${storeName.padEnd(8)} round ${round}  bare ${fmt(b)}   service ${fmt(s)}   ratio ${(s.perSecond / b.perSecond).toFixed(4)}`);
    }
    const check = await store.verify();
    console.log(`${body.name.padEnd(30)} ${storeName.padEnd(8)} median ratio ${median(ratios).toFixed(4)}; chain of ${check.records} records verifies: ${check.ok}`);
    await service.app.close();
    await store.close();
    await done();
  }
  await bare.app.close();
}

console.log(`loopback, ${connections} connections, ${seconds} s per run, ${rounds} rounds, Node ${process.version}, body ${bodies.map((b) => `${b.name} ${(b.text.length / 1024).toFixed(1)} KiB`).join(', ')}`);
await measure('sqlite', async () => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-bench-http-'));
  const auditDb = join(dir, 'audit.sqlite');
  return { store: await openAuditStore(auditDb), auditDb, done: async () => rmSync(dir, { recursive: true, force: true }) };
});
const pgUrl = process.env.PARSIMETRY_TEST_PG_URL;
if (pgUrl) {
  const schemas: string[] = [];
  try {
    await measure('postgres', async () => {
      const schema = `bench_http_${randomBytes(4).toString('hex')}`;
      schemas.push(schema);
      return { store: await openAuditStore(pgUrl, { schema }), auditDb: pgUrl, done: async () => {} };
    });
  } finally {
    await dropBenchSchemas(pgUrl, schemas);
  }
}
