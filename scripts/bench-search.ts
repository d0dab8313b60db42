// Subsets per second of the search kernels against refitting each subset by
// QR on the rows (src/core/fit), measured in the same run; then 2^20 subsets
// of a 20-term pool exhaustively on one thread and on every core (the
// service's compute pool, started once and kept, as the service does).
//   npx tsx scripts/bench-search.ts [rows=1000] [terms=20] [streamRows=1e7]
// Then branch and bound beyond exhaustive reach: 30, 36 and 40 correlated
// readings with eight real effects (scripts/wide-pool-data.ts, 2,000 rows),
// and a 36-term screening pool (8 factors and their 28 two-way products,
// hierarchy), on one thread and on every core: time, tree nodes, nodes per
// second, against the exhaustive kernel's subsets per second on the 30-term
// pool measured in the same run.
// Last, peak memory (resident set) while 10^7 generated NDJSON rows are
// folded into a data summary by the streaming upload's code, in process
// (streamRows=0 skips it).
// The data are random (a benchmark needs only their shape).

import { availableParallelism } from 'node:os';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { hierarchyRules, planBranchAndBound, scoreGrayRange, scoreSubsetRange, subsetProblemFromDesign, noHierarchy, type SubsetProblem } from '../src/core/search/index.ts';
import { buildDesign } from '../src/core/design/index.ts';
import type { Columns, Term } from '../src/core/types.ts';
import { seededNormal, seededUniform } from './seeded-random.ts';
import { widePool } from './wide-pool-data.ts';
import { runInThread, runSearch } from '../src/search/workers/index.ts';
import { ComputePool } from '../src/compute/index.ts';
import { JOB_WORKER_MODULE } from '../src/http/jobs/index.ts';
import { Readable } from 'node:stream';
import { foldRows } from '../src/http/streaming/fold-body.ts';
import type { DesignMatrix } from '../src/core/types.ts';

const rows = Number(process.argv[2] ?? 1000);
const m = Number(process.argv[3] ?? 20);
let seed = 12345;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const x = Array.from({ length: m }, () => Float64Array.from({ length: rows }, () => uniform() - 0.5));
const y = Float64Array.from({ length: rows }, (_, i) => x[0][i] + 0.5 * x[1][i] - 0.3 * x[2][i] + 0.5 * (uniform() - 0.5));
const designOf = (terms: number[]): DesignMatrix => {
  const high = [new Float64Array(rows).fill(1), ...terms.map((t) => x[t])];
  return { rows, labels: ['intercept', ...terms.map((t) => `x${t}`)], high, low: high.map(() => new Float64Array(rows)), intercept: true, termOfColumn: [-1, ...terms] };
};
const all = [...Array(m).keys()];
const problem = subsetProblemFromDesign(designOf(all), y, null, m, noHierarchy(m));
const settings = { criterion: 'aicc', top: 20, rankDeficient: 'score' } as const;
const total = 2 ** m;

const time = <T>(f: () => T): [T, number] => {
  const t0 = performance.now();
  const r = f();
  return [r, (performance.now() - t0) / 1000];
};

// Baseline: QR refits of a sample of subsets (every subset would take minutes).
const sample = Math.min(total, 2000);
const [, qrSeconds] = time(() => {
  for (let s = 0; s < sample; s++) {
    const mask = Math.floor((s * total) / sample);
    fitLeastSquares(designOf(all.filter((t) => (mask >>> t) & 1)), y);
  }
});
const qrRate = sample / qrSeconds;
const [, countingSeconds] = time(() => scoreSubsetRange(problem, settings, 0, total));
const [, graySeconds] = time(() => scoreGrayRange(problem, settings, 0, total));
const countingRate = total / countingSeconds;
const grayRate = total / graySeconds;
const threads = availableParallelism();
const pool = new ComputePool({ size: threads, queueLength: 0, deadlineMs: 600_000, workerModule: JOB_WORKER_MODULE });
const onPool = async () => {
  const session = pool.open();
  try {
    return await runSearch(problem, settings, { run: (task) => session.runOn({ kind: 'searchTask', task }), parallelism: threads });
  } finally {
    session.close();
  }
};
const t0 = performance.now();
const pooled = await onPool();
const pooledSeconds = (performance.now() - t0) / 1000;
// The first run starts the workers (and, from sources, their TypeScript loader); the second finds them warm, as a service's requests do.
const t1 = performance.now();
await onPool();
const pooledAgainSeconds = (performance.now() - t1) / 1000;

const f = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 0 });
console.log(`pool ${m} terms, ${rows} rows, ${f(total)} subsets`);
console.log(`QR refit per subset (src/core/fit), ${sample} sampled: ${f(qrRate)} subsets/s`);
console.log(`Gray-code sweep kernel, 1 thread: ${graySeconds.toFixed(2)} s, ${f(grayRate)} subsets/s, ${(grayRate / qrRate).toFixed(0)}x QR`);
console.log(`counting-order sweep kernel (the service's), 1 thread: ${countingSeconds.toFixed(2)} s, ${f(countingRate)} subsets/s, ${(countingRate / qrRate).toFixed(0)}x QR`);
console.log(`worker pool, ${threads} threads (incl. worker start): ${pooledSeconds.toFixed(2)} s, ${f(total / pooledSeconds)} subsets/s, ${(countingSeconds / pooledSeconds).toFixed(2)}x one thread`);
console.log(`worker pool again, workers warm: ${pooledAgainSeconds.toFixed(2)} s, ${(countingSeconds / pooledAgainSeconds).toFixed(2)}x one thread`);
if (!pooled.ok) console.log('pool refused:', pooled.issue.message);

/** The search problem of numeric columns and terms, as the service builds it (all rows complete). */
function problemOf(columns: Columns, response: string, pool: Term[], hierarchy: boolean): SubsetProblem {
  const n = (columns[response] as number[]).length;
  const built = buildDesign(columns, pool, true, [...Array(n).keys()]);
  if ('issues' in built) throw new Error(built.issues[0].message);
  const rules = hierarchy ? hierarchyRules(pool, []) : noHierarchy(pool.length);
  return subsetProblemFromDesign(built.design, Float64Array.from(columns[response] as number[]), null, pool.length, rules);
}

/** 8 process factors in [0, 10] (uncentred, so products correlate with their factors), their 28 products, 400 runs. */
function screeningPool(): { columns: Columns; pool: Term[] } {
  const uniform = seededUniform(5);
  const normal = seededNormal(uniform);
  const names = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h'];
  const columns: Record<string, number[]> = { y: [] };
  for (const name of names) columns[name] = [];
  for (let i = 0; i < 400; i++) {
    const v = names.map(() => 10 * uniform());
    v.forEach((x, j) => columns[names[j]].push(x));
    const c = v.map((x) => x / 5 - 1);
    columns.y.push(3 + 0.8 * c[0] - 0.5 * c[1] + 0.3 * c[2] + 0.4 * c[0] * c[1] - 0.25 * c[2] * c[3] + 0.15 * c[4] + normal());
  }
  const pool: Term[] = [...names];
  for (let i = 0; i < 8; i++) for (let j = i + 1; j < 8; j++) pool.push({ kind: 'product', of: [names[i], names[j]] });
  return { columns, pool };
}

const searchCases: { name: string; problem: SubsetProblem }[] = [30, 36, 40].map((terms) => {
  const w = widePool({ terms });
  return { name: `${terms} correlated readings`, problem: problemOf(w.columns, w.response, w.pool, false) };
});
const screening = screeningPool();
searchCases.push({ name: '36-term screening pool, hierarchy', problem: problemOf(screening.columns, 'y', screening.pool, true) });
const bnbSettings = { criterion: 'aicc', top: 10, rankDeficient: 'skip' } as const;
// The baseline: the exhaustive kernel's rate on the 30-term pool (2^20 of its subsets; d = 31).
const sampleTo = 2 ** 20;
const [, wideExhaustiveSeconds] = time(() => scoreSubsetRange(searchCases[0].problem, bnbSettings, 0, sampleTo));
const wideRate = sampleTo / wideExhaustiveSeconds;
console.log(`exhaustive kernel on the 30-term pool, 1 thread, ${f(sampleTo)} subsets: ${f(wideRate)} subsets/s (the baseline below)`);
for (const c of searchCases) {
  const m = c.problem.poolBlocks.length;
  const [, planSeconds] = time(() => planBranchAndBound(c.problem, bnbSettings));
  // CPU time of the whole process (every thread): on a shared machine it shows the work that wall time hides.
  const cpuSeconds = (since: NodeJS.CpuUsage) => {
    const u = process.cpuUsage(since);
    return (u.user + u.system) / 1e6;
  };
  const c0 = process.cpuUsage();
  const b0 = performance.now();
  const alone = await runSearch(c.problem, bnbSettings, { run: runInThread, parallelism: 1 });
  const aloneSeconds = (performance.now() - b0) / 1000;
  const aloneCpu = cpuSeconds(c0);
  const c1 = process.cpuUsage();
  const b1 = performance.now();
  const session = pool.open();
  const spread = await runSearch(c.problem, bnbSettings, { run: (task) => session.runOn({ kind: 'searchTask', task }), parallelism: threads }).finally(() => session.close());
  const spreadSeconds = (performance.now() - b1) / 1000;
  const spreadCpu = cpuSeconds(c1);
  if (!alone.ok || !spread.ok) throw new Error('refused');
  const nodes = alone.outcome.nodes;
  const rate = nodes / aloneSeconds;
  console.log(
    `branch and bound, ${c.name} (${m} terms, ${f(2 ** m)} subsets), AICc, best 10: ` +
      `1 thread ${aloneSeconds.toFixed(2)} s (cpu ${aloneCpu.toFixed(2)} s; plan ${planSeconds.toFixed(2)} s), ${f(nodes)} nodes, ${f(rate)} nodes/s = ${(rate / wideRate).toFixed(3)}x the exhaustive subsets/s, ` +
      `proven ${alone.outcome.proven}; ${threads} threads (pool warm) ${spreadSeconds.toFixed(2)} s (cpu ${spreadCpu.toFixed(2)} s, same answer ${JSON.stringify(spread.outcome.models) === JSON.stringify(alone.outcome.models)}); ` +
      `every subset at the exhaustive rate would take ${(2 ** m / wideRate / 3600).toFixed(0)} h`,
  );
}

// Streaming fold: the body is generated chunk by chunk (never held whole), as a client would send it.
const streamRows = Number(process.argv[4] ?? 1e7);
if (streamRows === 0) process.exit(0);
const LINES_PER_CHUNK = 10_000;
function* ndjsonChunks(): Generator<string> {
  for (let from = 0; from < streamRows; from += LINES_PER_CHUNK) {
    let chunk = '';
    for (let i = from; i < Math.min(streamRows, from + LINES_PER_CHUNK); i++) {
      const t = 1150 + 100 * uniform();
      const m = 4 + 4 * uniform();
      chunk += `{"peakTemp":${t},"moisture":${m},"holdMinutes":${Math.round(30 + 60 * uniform())},"shrinkage":${7 + 0.018 * (t - 1200) + 0.35 * (m - 6) + 0.15 * (uniform() - 0.5)}}\n`;
    }
    yield chunk;
  }
}
global.gc?.();
const rssBefore = process.memoryUsage().rss;
let peak = rssBefore;
const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
const s0 = performance.now();
const folded = await foldRows(Readable.from(ndjsonChunks(), { objectMode: false }), {
  format: 'ndjson', columns: ['peakTemp', 'moisture', 'holdMinutes', 'shrinkage'], maxBodyBytes: Number.MAX_SAFE_INTEGER,
});
clearInterval(sampler);
peak = Math.max(peak, process.memoryUsage().rss);
const streamSeconds = (performance.now() - s0) / 1000;
const mb = (b: number) => (b / 2 ** 20).toFixed(0);
console.log(`streaming fold of ${f(folded.rowsRead)} NDJSON rows (${mb(folded.bytes)} MiB): ${streamSeconds.toFixed(1)} s, ${f(folded.rowsRead / streamSeconds)} rows/s; resident memory ${mb(rssBefore)} MiB before, peak ${mb(peak)} MiB (+${mb(peak - rssBefore)} MiB)`);
await pool.close();
