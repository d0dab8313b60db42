// Isolation under hostile load: the service as an operator runs it (a child
// process, default settings but a 5 s compute deadline so stopped work shows
// within the run), first idle, then under a mix of requests that are small on
// the wire and ask for enormous work — wide products of text factors, a
// factor of hundreds of levels, big and abandoned searches, a wide summary
// with always terms, twenty models predicting at 100,000 rows. Throughout,
// /healthz is polled every 20 ms. Printed: the service's event-loop delay p99
// (its own monitor, read from /metrics) and /healthz p99 in each phase, the
// hostile phase as a ratio of the idle one from the same run, peak resident
// memory, and what each kind of request was answered.
//   npx tsx scripts/bench-isolation.ts [idleSeconds=10] [hostileSeconds=30] [clients=6]
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startService } from '../test/service/service-process.ts';
import { manyLevels, manyPredictions, wideProductOfFactors, zoneSearch, zoneSummary } from '../test/http/limits/hostile-bodies.ts';

const idleSeconds = Number(process.argv[2] ?? 10);
const hostileSeconds = Number(process.argv[3] ?? 30);
const clients = Number(process.argv[4] ?? 6);

const summary = zoneSummary(150);
const kinds: { name: string; path: string; body: string; leaveAfterMs?: number }[] = [
  { name: 'product of three text factors', path: '/v1/comparisons', body: JSON.stringify(wideProductOfFactors()) },
  { name: 'factor of 300 levels, 2 models', path: '/v1/comparisons', body: JSON.stringify(manyLevels(3000, 300, 2)) },
  { name: 'factor of 600 levels, 3 models', path: '/v1/comparisons', body: JSON.stringify(manyLevels(6000, 600, 3)) },
  { name: '20 models × 100,000 predictions', path: '/v1/comparisons', body: JSON.stringify(manyPredictions()) },
  { name: 'search, 22-term pool', path: '/v1/searches', body: JSON.stringify(zoneSearch(3000, 22)) },
  { name: 'search, client leaves after 0.5 s', path: '/v1/searches', body: JSON.stringify(zoneSearch(3000, 22)), leaveAfterMs: 500 },
  { name: 'wide summary + always, exhaustive', path: '/v1/searches', body: JSON.stringify({ data: { summary }, response: 'thickness', pool: summary.columns.slice(0, 20), always: summary.columns.slice(20, 149), exhaustive: true }) },
];

const dir = mkdtempSync(join(tmpdir(), 'parsimetry-isolation-'));
const service = await startService({ AUDIT_DB: join(dir, 'audit.sqlite'), COMPUTE_DEADLINE_MS: '5000' }, 120_000);
const pid = service.child.pid!;
const kib = (field: 'VmRSS' | 'VmHWM') => Number(new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0);
const mib = (k: number) => (k / 1024).toFixed(0);
/** CPU seconds of the service's main thread (its task id is the process id), from its scheduler statistics. */
const mainThreadCpuSeconds = () => {
  const fields = readFileSync(`/proc/${pid}/task/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100; // utime + stime, in USER_HZ ticks
};

async function loopDelayP99Ms(): Promise<number> {
  // prom-client's monitor resets at every scrape, so each scrape covers the time since the last.
  const text = await (await fetch(`${service.base}/metrics`)).text();
  return 1000 * Number(/^parsimetry_nodejs_eventloop_lag_p99_seconds (\S+)$/m.exec(text)?.[1] ?? NaN);
}

const percentile = (values: number[], q: number) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
};

const outcomes = new Map<string, Map<string, number>>();
function count(kind: string, outcome: string) {
  const byKind = outcomes.get(kind) ?? new Map<string, number>();
  byKind.set(outcome, (byKind.get(outcome) ?? 0) + 1);
  outcomes.set(kind, byKind);
}

async function hostileClient(first: number, until: number): Promise<void> {
  for (let i = first; Date.now() < until; i++) {
    const kind = kinds[i % kinds.length];
    const abort = new AbortController();
    const timer = kind.leaveAfterMs ? setTimeout(() => abort.abort(), kind.leaveAfterMs) : null;
    try {
      const res = await fetch(`${service.base}${kind.path}`, { method: 'POST', body: kind.body, headers: { 'content-type': 'application/json' }, signal: abort.signal });
      const text = await res.text();
      const type = res.status === 200 ? '' : ` ${(/"type":"urn:parsimetry:problem:([^"]+)"/.exec(text)?.[1] ?? '')}`;
      count(kind.name, `${res.status}${type}`);
    } catch {
      count(kind.name, 'client left');
    } finally {
      if (timer) clearTimeout(timer);
    }
  }
}

async function phase(seconds: number, hostile: boolean) {
  await loopDelayP99Ms();
  const cpu0 = mainThreadCpuSeconds();
  const until = Date.now() + seconds * 1000;
  const load = hostile ? Array.from({ length: clients }, (_, c) => hostileClient(c, until)) : [];
  const health: number[] = [];
  let failures = 0;
  let rssPeak = 0;
  while (Date.now() < until) {
    const t0 = performance.now();
    const res = await fetch(`${service.base}/healthz`).catch(() => null);
    health.push(performance.now() - t0);
    if (res?.status !== 200) failures++;
    await res?.text();
    rssPeak = Math.max(rssPeak, kib('VmRSS'));
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  const loopP99 = await loopDelayP99Ms();
  const mainBusy = (mainThreadCpuSeconds() - cpu0) / seconds;
  await Promise.all(load);
  return { loopP99, healthP99: percentile(health, 0.99), probes: health.length, failures, rssPeak, mainBusy };
}

const idle = await phase(idleSeconds, false);
const hostile = await phase(hostileSeconds, true);
const alive = (await fetch(`${service.base}/healthz`)).status === 200;
const hwm = kib('VmHWM');
service.child.kill('SIGTERM');
await service.exited;
rmSync(dir, { recursive: true, force: true });

console.log(`isolation: ${clients} hostile clients for ${hostileSeconds} s against ${idleSeconds} s idle, /healthz every 20 ms`);
console.log(`${'phase'.padEnd(8)} ${'loop delay p99'.padStart(15)} ${'/healthz p99'.padStart(13)} ${'probes'.padStart(7)} ${'failed'.padStart(7)} ${'peak RSS'.padStart(9)} ${'main thread busy'.padStart(17)}`);
for (const [name, p] of [['idle', idle], ['hostile', hostile]] as const) {
  console.log(`${name.padEnd(8)} ${p.loopP99.toFixed(1).padStart(12)} ms ${p.healthP99.toFixed(1).padStart(10)} ms ${String(p.probes).padStart(7)} ${String(p.failures).padStart(7)} ${mib(p.rssPeak).padStart(5)} MiB ${(100 * p.mainBusy).toFixed(0).padStart(15)} %`);
}
console.log(`hostile / idle: loop delay p99 ${(hostile.loopP99 / idle.loopP99).toFixed(2)}x, /healthz p99 ${(hostile.healthP99 / idle.healthP99).toFixed(2)}x`);
console.log(`process peak resident memory (VmHWM): ${mib(hwm)} MiB; alive after the mix: ${alive ? 'yes' : 'NO'}`);
console.log('answers in the hostile mix:');
for (const kind of kinds) {
  const seen = [...(outcomes.get(kind.name) ?? new Map()).entries()].map(([k, v]) => `${k} ×${v}`).join(', ');
  console.log(`  ${kind.name.padEnd(36)} ${seen || '(none sent)'}`);
}
