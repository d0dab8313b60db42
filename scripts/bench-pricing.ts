// How well the cost model (src/core/pricing) tracks time: requests of very
// different shapes are priced, then computed on this thread by the same job
// functions the compute pool runs, and each prints its estimate, its time and
// the nanoseconds per estimated multiply-add. The last column is each kind's
// rate against the median of this run: near 1 everywhere means one cap in
// multiply-adds means the same time whatever the shape. Time is this
// process's CPU time (user + system), not the wall clock: on a shared machine
// the wall clock also counts other processes' turns, unevenly from case to
// case. Each case runs REPEATS times (default 3) and keeps its least time,
// the usual guard against a neighbour's burst and late compilation. The data
// are generated (a benchmark needs only shapes).
//   npx tsx scripts/bench-pricing.ts      (REPEATS=5 npx tsx ... for more runs per case)
import { availableParallelism } from 'node:os';
import { defaultConfig } from '../src/config.ts';
import { DEFAULT_ACTIVE_POLICY } from '../src/policy-file.ts';
import type { Term } from '../src/core/types.ts';
import { runSearch } from '../src/search/workers/index.ts';
import { runTask } from '../src/search/workers/run-task.ts';
import { priceCaps } from '../src/http/compute/caps.ts';
import { priceComparisonRequest, priceSearchRequest } from '../src/http/compute/price-request.ts';
import { comparisonJob } from '../src/http/jobs/comparison-job.ts';
import { searchPrepareJob, searchReportJob } from '../src/http/jobs/search-jobs.ts';
import { ComparisonRequest } from '../src/http/schemas/comparison-request.ts';
import { SearchRequest } from '../src/http/schemas/search-request.ts';
import { loadNls, nlsExpression } from '../test/reference/nist-nls/strd-nls.ts';

const policy = DEFAULT_ACTIVE_POLICY;
const REPEATS = Math.max(1, Number(process.env.REPEATS ?? 3));
// Caps high enough that nothing here is refused: this measures, it does not guard.
const caps = priceCaps(defaultConfig({ maxRequestWork: 1e15, maxRequestMemoryBytes: 1e15, maxResultBytes: 1e15, maxDesignColumns: 10_000 }));

let seed = 20260611;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const numeric = (n: number) => Array.from({ length: n }, () => Math.round((uniform() * 100 - 50) * 1e6) / 1e6);
const response = (n: number, ...xs: number[][]) => Array.from({ length: n }, (_, i) => xs.reduce((s, x, j) => s + x[i] * (j % 3 === 0 ? 0.3 : -0.1), 0) + uniform());

/** CPU seconds (user + system) of this process since `from`. */
const cpuSeconds = (from: NodeJS.CpuUsage) => {
  const used = process.cpuUsage(from);
  return (used.user + used.system) / 1e6;
};

/** `refusal`: the issue code the case is built to end with (a fit run to its iteration cap is refused, its work done all the same). */
function comparisonCase(label: string, request: unknown, refusal?: string) {
  const body = ComparisonRequest.parse(request);
  const priced = priceComparisonRequest(body, policy, caps);
  if ('issues' in priced) throw new Error(`${label}: ${priced.issues[0].message}`);
  let seconds = Infinity;
  for (let r = 0; r < REPEATS; r++) {
    const t0 = process.cpuUsage();
    const out = comparisonJob({ kind: 'comparison', body, policy, resultCap: caps.resultBytes, schemaCheck: false });
    seconds = Math.min(seconds, cpuSeconds(t0));
    const ended = 'result' in out ? null : 'issues' in out ? out.issues[0]?.code : 'other';
    if (ended !== (refusal ?? null)) throw new Error(`${label}: ${JSON.stringify(out).slice(0, 300)}`);
  }
  return { label, work: priced.price.work, seconds };
}

async function searchCase(label: string, request: unknown) {
  const body = SearchRequest.parse(request);
  const priced = priceSearchRequest(body, caps, 1);
  if ('issues' in priced) throw new Error(`${label}: ${priced.issues[0].message}`);
  let seconds = Infinity;
  for (let r = 0; r < REPEATS; r++) seconds = Math.min(seconds, await searchOnce(label, body, priced));
  return { label, work: priced.price.work, seconds };
}

async function searchOnce(label: string, body: SearchRequest, priced: Extract<ReturnType<typeof priceSearchRequest>, { budget: unknown }>) {
  const t0 = process.cpuUsage();
  const prepared = searchPrepareJob({ kind: 'searchPrepare', body, policy, budget: priced.budget });
  if ('issues' in prepared) throw new Error(`${label}: ${prepared.issues[0].message}`);
  const settings = { criterion: prepared.prepared.choice.rankBy, top: body.top, rankDeficient: 'skip' } as const;
  const run = await runSearch(prepared.prepared.problem, settings, { run: async (task) => ({ value: runTask(task), worker: 0 }), parallelism: 1, budget: priced.budget });
  if (!run.ok) throw new Error(`${label}: ${run.issue.message}`);
  const report = searchReportJob({
    kind: 'searchReport', body, policy, prepared: prepared.prepared, outcome: run.outcome,
    run: { threads: 1, elapsedMs: 0, budget: run.budget, estimatedFlops: run.estimatedFlops }, resultCap: caps.resultBytes, schemaCheck: false,
  });
  if (!('result' in report)) throw new Error(`${label}: ${JSON.stringify(report).slice(0, 300)}`);
  return cpuSeconds(t0);
}

/** `count` numeric columns x0, x1, … of `rows` rows and a response y built from them. */
function table(rows: number, count: number) {
  const xs = Array.from({ length: count }, () => numeric(rows));
  const columns: Record<string, unknown[]> = Object.fromEntries(xs.map((x, j) => [`x${j}`, x]));
  columns.y = response(rows, ...xs);
  return { xs, columns };
}

const { xs, columns: bigColumns } = table(100_000, 30);

const levels = 300;
const rowsF = 3000;
const factor = Array.from({ length: rowsF }, (_, i) => `batch-${(i * 7919) % levels}`);
const xF = numeric(rowsF);

const { columns: smallColumns } = table(120, 10);
const smallTerms = (k: number): Term[] => Array.from({ length: k }, (_, j) => `x${j % 10}`).filter((v, i, a) => a.indexOf(v) === i);

const { xs: mx, columns: midColumns } = table(2000, 16);

// A summary of 160 columns (response last) from generated rows: C = Σ (x - x̄)(z - z̄).
const summaryColumns = 160;
const sRows = 400;
const srows = Array.from({ length: summaryColumns }, () => numeric(sRows));
const means = srows.map((c) => c.reduce((a, b) => a + b, 0) / sRows);
const cross = srows.map((a, i) => srows.map((b, j) => a.reduce((s, v, r) => s + (v - means[i]) * (b[r] - means[j]), 0)));
const summary = { rows: sRows, columns: srows.map((_, j) => (j === summaryColumns - 1 ? 'y' : `s${j}`)), means, centredCrossProducts: cross };

// Pass/fail and count responses on the same 100,000 × 30 design, for the generalised linear kind.
const linear = bigColumns.y as number[];
const passFail = linear.map((v) => (uniform() < 1 / (1 + Math.exp(-0.1 * v)) ? 1 : 0));
/** A Poisson draw by counting unit-rate arrivals (mean exp(0.5 + 0.02 v) stays small here). */
const poissonDraw = (mean: number) => {
  let k = 0;
  for (let s = -Math.log(1 - uniform()); s < mean; s -= Math.log(1 - uniform())) k++;
  return k;
};
const counts = linear.map((v) => poissonDraw(Math.exp(0.5 + 0.02 * v)));
const glmColumns = { ...bigColumns, passFail, counts };

// Life data. A lifetime fit is priced at its iteration cap (2 starts × 50
// Newton iterations) and these converge in about 5, so expect their column
// near 0.05×: the estimate is an upper bound, and per iteration used the
// rate matches the other kinds'. Weibull lives (shape 2) whose log-scale falls with x0 and x1,
// right-censored at a fixed test end, and every fifth unit read only at
// inspections (interval-censored between multiples of 2).
function lives(rows: number) {
  const x0 = numeric(rows);
  const x1 = numeric(rows);
  const time: number[] = [];
  const upper: (number | null)[] = [];
  const status: string[] = [];
  for (let i = 0; i < rows; i++) {
    const life = Math.exp(3 - 0.01 * x0[i] + 0.005 * x1[i]) * Math.pow(-Math.log(1 - uniform()), 0.5);
    if (life > 30) { time.push(30); upper.push(null); status.push('right'); } else if (i % 5 === 0) {
      const start = 2 * Math.floor(life / 2);
      time.push(start); upper.push(start + 2); status.push('interval');
    } else { time.push(life); upper.push(null); status.push('exact'); }
  }
  return { data: { columns: { time, upper, status, x0, x1 } }, response: 'time', censoring: { status: 'status', upper: 'upper' } };
}

// Nonlinear fits are priced at their iteration cap (1,000 per start): Bennett5 from
// NIST's first start takes 747 iterations, near the cap, so its rate is the
// one to hold near the others; a fit that stops early (10,000 rows, ~10
// iterations) runs far below its price by design.
const bennett5 = loadNls('bennett5');
const nlRows = 10_000;
const nlHours = Array.from({ length: nlRows }, (_, i) => (96 * i) / (nlRows - 1));
const nlMoisture = nlHours.map((h) => 6 + 36 * Math.exp(-0.045 * h) + uniform() - 0.5);
// Bennett5's curve (its certified estimates) on 10,000 rows over its x range,
// with a little noise: from NIST's first start it runs to the 1,000-iteration
// cap and is refused, the worst case the price is for, at a size where the
// per-row cost of an iteration, not its bookkeeping, dominates.
const b5x = Array.from({ length: nlRows }, (_, i) => 7.447 + ((11.85 - 7.447) * i) / (nlRows - 1));
const b5Long = { x: b5x, y: b5x.map((x) => -2523.5 * Math.pow(46.737 + x, -1 / 0.93218) + 0.002 * (uniform() - 0.5)) };

const bennett5Request = {
  data: { columns: bennett5.data }, response: 'y',
  candidates: [{ name: 'b5', expression: nlsExpression(bennett5), start: Object.fromEntries(bennett5.parameterNames.map((p, j) => [p, bennett5.startValues.start1[j]])) }],
};
// The expression interpreter's code is not shared with least squares: warm it up
// as the other kinds' paths are by the cases before them (one cold Bennett5 fit
// measured about four times a warm one).
for (let k = 0; k < 3; k++) comparisonCase('warm-up', bennett5Request);

const cases = [
  comparisonCase('comparison: logistic GLM, 100,000 rows × 31 columns', { data: { columns: glmColumns }, response: 'passFail', candidates: [{ name: 'all', terms: xs.map((_, j) => `x${j}`), family: 'binomial' }] }),
  comparisonCase('comparison: Poisson GLM, 100,000 rows × 31 columns', { data: { columns: glmColumns }, response: 'counts', candidates: [{ name: 'all', terms: xs.map((_, j) => `x${j}`), family: 'poisson' }] }),
  comparisonCase('lifetime: Weibull and lognormal AFT, 20,000 rows', { ...lives(20_000), candidates: [{ name: 'w', distribution: 'weibull', terms: ['x0', 'x1'] }, { name: 'l', distribution: 'lognormal', terms: ['x0', 'x1'] }] }),
  comparisonCase('lifetime: gamma AFT, 3,000 censored rows', { ...lives(3_000), candidates: [{ name: 'g', distribution: 'gamma', terms: ['x0', 'x1'] }] }),
  comparisonCase('comparison: 100,000 rows × 31 columns, 1 model', { data: { columns: bigColumns }, response: 'y', candidates: [{ name: 'all', terms: xs.map((_, j) => `x${j}`) }] }),
  comparisonCase('comparison: one factor of 300 levels, 3000 rows', { data: { columns: { y: response(rowsF, xF), x: xF, batch: factor } }, response: 'y', candidates: [{ name: 'batch', terms: ['x', 'batch'] }, { name: 'x', terms: ['x'] }] }),
  comparisonCase('comparison: 60 small models, 120 rows', { data: { columns: smallColumns }, response: 'y', candidates: Array.from({ length: 60 }, (_, i) => ({ name: `m${i}`, terms: smallTerms(1 + (i % 10)) })) }),
  comparisonCase('comparison: 5 models, 20,000 prediction rows', {
    data: { columns: midColumns }, response: 'y',
    candidates: Array.from({ length: 5 }, (_, i) => ({ name: `m${i}`, terms: Array.from({ length: 3 + 3 * i }, (_, j) => `x${j}`) })),
    options: { predict: { columns: Object.fromEntries(mx.map((_, j) => [`x${j}`, numeric(20_000)])) } },
  }),
  comparisonCase('comparison: from a 160-column summary, 10 models', { data: { summary }, response: 'y', candidates: Array.from({ length: 10 }, (_, i) => ({ name: `m${i}`, terms: Array.from({ length: 15 * (i + 1) }, (_, j) => `s${j}`) })) }),
  await searchCase('search: 16-term pool, 2000 rows, every subset', { data: { columns: midColumns }, response: 'y', pool: mx.map((_, j) => `x${j}`), top: 20 }),
  await searchCase('search: summary, 12-term pool + 140 always', { data: { summary }, response: 'y', pool: Array.from({ length: 12 }, (_, j) => `s${j}`), always: Array.from({ length: 140 }, (_, j) => `s${12 + j}`), top: 10, exhaustive: true }),
  comparisonCase('nonlinear: NIST Bennett5, 747 iterations', bennett5Request),
  comparisonCase('nonlinear: 10,000 rows, runs to its cap', { ...bennett5Request, data: { columns: b5Long } }, 'nonlinear_not_converged'),
  comparisonCase('nonlinear: 10,000 rows, stops early', {
    data: { columns: { hours: nlHours, moisture: nlMoisture } }, response: 'moisture',
    candidates: [{ name: 'eq', expression: 'eq + (m0 - eq)*exp(-k*hours)', start: { eq: 5, m0: 40, k: 0.03 } }],
  }),
];

const rates = cases.map((c) => (c.seconds * 1e9) / c.work);
const median = [...rates].sort((a, b) => a - b)[Math.floor(rates.length / 2)];
console.log(`cost model against CPU time, one thread (${availableParallelism()} cores; figures from a busy shared machine)`);
console.log(`${'request'.padEnd(52)} ${'estimate'.padStart(10)} ${'CPU s'.padStart(8)} ${'ns/unit'.padStart(8)} ${'vs median'.padStart(9)}`);
cases.forEach((c, i) => {
  console.log(`${c.label.padEnd(52)} ${c.work.toExponential(2).padStart(10)} ${c.seconds.toFixed(3).padStart(8)} ${rates[i].toFixed(2).padStart(8)} ${(rates[i] / median).toFixed(2).padStart(8)}x`);
});
console.log(`median ${median.toFixed(2)} ns per estimated multiply-add: MAX_REQUEST_WORK=${defaultConfig().maxRequestWork.toExponential(1)} is about ${((defaultConfig().maxRequestWork * median) / 1e9).toFixed(1)} s of one core here`);
