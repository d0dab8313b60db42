// Load figures on loopback, bounded: the service in-process (SQLite in a temp
// dir), autocannon POSTing the demo comparison, then GET /healthz as the
// baseline measured in the same run. Usage: npx tsx scripts/load.ts [seconds] [connections]
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';

// autocannon ships no type declarations; this is the part used here.
interface LoadResult { '2xx': number; non2xx: number; errors: number; latency: { p50: number; p99: number } }
const autocannon = createRequire(import.meta.url)('autocannon') as (options: Record<string, unknown>) => Promise<LoadResult>;

const seconds = Math.min(60, Number(process.argv[2] ?? 10));
const connections = Math.min(64, Number(process.argv[3] ?? 8));

const dir = mkdtempSync(join(tmpdir(), 'parsimetry-load-'));
const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), rateLimitPerMinute: 10_000_000, eventLoopMaxDelayMs: 0 });
const store = await openAuditStore(config.auditDb);
const app = await buildApp({ config, store, logger: false });
const url = await app.listen({ host: '127.0.0.1', port: 0 });

async function run(title: string, path: string, options: Record<string, unknown> = {}) {
  const result = await autocannon({ url: `${url}${path}`, connections, duration: seconds, ...options });
  const ok = result['2xx'];
  const perSecond = ok / seconds;
  console.log(`${title.padEnd(28)} ${perSecond.toFixed(1).padStart(9)} /s   p50 ${String(result.latency.p50).padStart(5)} ms   p99 ${String(result.latency.p99).padStart(5)} ms   non-2xx ${result.non2xx}  errors ${result.errors}`);
  return perSecond;
}

console.log(`loopback, ${connections} connections, ${seconds} s each, Node ${process.version}`);
const comparisons = await run('POST /v1/comparisons (demo)', '/v1/comparisons', {
  method: 'POST', body: JSON.stringify(demoComparison()), headers: { 'content-type': 'application/json' },
});
const health = await run('GET /healthz (baseline)', '/healthz');
console.log(`comparisons per second relative to the /healthz baseline: ${(comparisons / health).toFixed(4)}`);
const stored = await store.list({ limit: 1 });
console.log(`audit records written: newest seq ${stored.records[0]?.seq ?? 0}`);
await app.close();
await store.close();
rmSync(dir, { recursive: true, force: true });
