// One comparison path, in process, for a CPU profile and a steadier figure than
// sockets give on a shared machine: CPU time per comparison beside wall time,
// through app.inject with the durable SQLite audit, as production runs it
// (answers as plain JSON, the compute pool started with the service). CPU is
// read per thread from /proc (Linux): the main thread's share is what bounds
// the requests/s of one process, the total what bounds the machine's; both
// count CPU actually used, so other load on the machine inflates them little.
//   node --cpu-prof --cpu-prof-dir=out/profile --import tsx scripts/profile-comparison.ts [comparisons, default 400] [rows, default 300] [in flight, default 1]
//   npx tsx scripts/profile-summary.ts out/profile/<main thread>.cpuprofile
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { defaultConfig } from '../src/config.ts';
import { openAuditStore } from '../src/audit/open.ts';
import { buildApp, computePoolFor } from '../src/http/app.ts';
import { demoComparison } from './demo-data.ts';

const n = Number(process.argv[2] ?? 400);
const rows = Number(process.argv[3] ?? 300);
const inFlight = Math.max(1, Number(process.argv[4] ?? 1));
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-profile-'));
const config = defaultConfig({ auditDb: join(dir, 'audit.sqlite'), rateLimitPerMinute: 1e9, eventLoopMaxDelayMs: 0, responseSchemaCheck: false });
const store = await openAuditStore(config.auditDb);
const compute = computePoolFor(config);
if (!process.env.NO_POOL) compute.start();
let pooled = 0;
const open = compute.open.bind(compute);
compute.open = () => (pooled++, open());
const app = await buildApp({ config, store, logger: false, compute });
const payload = JSON.stringify(demoComparison(rows));

/** CPU milliseconds (user + system) of each thread of this process, by thread id; the main thread's id is the pid. */
function threadCpuMs(): Map<number, number> {
  const tick = 10; // USER_HZ is 100 on Linux
  const out = new Map<number, number>();
  for (const tid of readdirSync('/proc/self/task')) {
    try {
      const stat = readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      out.set(Number(tid), (Number(fields[11]) + Number(fields[12])) * tick);
    } catch {
      // the thread ended between the listing and the read
    }
  }
  return out;
}

async function one() {
  const r = await app.inject({ method: 'POST', url: '/v1/comparisons', payload, headers: { 'content-type': 'application/json' } });
  if (r.statusCode !== 200) throw new Error(`POST answered ${r.statusCode}: ${r.body.slice(0, 300)}`);
  return r;
}

async function many(count: number) {
  let next = 0;
  await Promise.all(Array.from({ length: inFlight }, async () => {
    while (next++ < count) await one();
  }));
}

while (!process.env.NO_POOL && compute.stats().ready < compute.size) await new Promise((resolve) => setTimeout(resolve, 20));
await many(50);
const before = threadCpuMs();
const cpu = process.cpuUsage();
const start = performance.now();
await many(n);
const wall = (performance.now() - start) / n;
const used = process.cpuUsage(cpu);
const after = threadCpuMs();
const mainMs = ((after.get(process.pid) ?? 0) - (before.get(process.pid) ?? 0)) / n;
let allMs = 0;
for (const [tid, ms] of after) allMs += ms - (before.get(tid) ?? 0);
allMs /= n;
console.log(`${rows} rows, 5 candidates, ${inFlight} in flight, ${compute.size} workers: ${wall.toFixed(2)} ms wall, ${((used.user + used.system) / 1000 / n).toFixed(2)} ms CPU per comparison (${(used.system / 1000 / n).toFixed(2)} ms of it system); ` +
  `by thread: main ${mainMs.toFixed(2)} ms, all ${allMs.toFixed(2)} ms; ${n} comparisons; ${pooled} ran on a worker; answer ${(await one()).body.length} bytes`);
await app.close();
await compute.close();
await store.close();
rmSync(dir, { recursive: true, force: true });
