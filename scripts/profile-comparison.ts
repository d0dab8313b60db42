// One comparison path, in process, for a CPU profile and a steadier figure than
// sockets give on a shared machine: CPU time per comparison (process.cpuUsage)
// beside wall time, through app.inject with the durable SQLite audit, one in
// flight, as production runs it (answers as plain JSON).
//   node --cpu-prof --cpu-prof-dir=out/profile --import tsx scripts/profile-comparison.ts [comparisons, default 400] [rows, default 300]
//   npx tsx scripts/profile-summary.ts out/profile/<main thread>.cpuprofile
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';

const n = Number(process.argv[2] ?? 400);
const rows = Number(process.argv[3] ?? 300);
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-profile-'));
const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), rateLimitPerMinute: 1e9, eventLoopMaxDelayMs: 0, responseSchemaCheck: false });
const store = await openAuditStore(config.auditDb);
const app = await buildApp({ config, store, logger: false });
const payload = JSON.stringify(demoComparison(rows));

async function one() {
  const r = await app.inject({ method: 'POST', url: '/v1/comparisons', payload, headers: { 'content-type': 'application/json' } });
  if (r.statusCode !== 200) throw new Error(`POST answered ${r.statusCode}: ${r.body.slice(0, 300)}`);
  return r;
}

for (let i = 0; i < 50; i++) await one();
const cpu = process.cpuUsage();
const start = performance.now();
for (let i = 0; i < n; i++) await one();
const wall = (performance.now() - start) / n;
const used = process.cpuUsage(cpu);
console.log(`${rows} rows, 5 candidates: ${wall.toFixed(2)} ms wall, ${((used.user + used.system) / 1000 / n).toFixed(2)} ms CPU per comparison (${(used.system / 1000 / n).toFixed(2)} ms of it system), ${n} comparisons; answer ${(await one()).body.length} bytes`);
await app.close();
await store.close();
rmSync(dir, { recursive: true, force: true });
