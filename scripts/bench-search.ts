// Subsets per second of the search kernels against refitting each subset by
// QR on the rows (src/core/fit), measured in the same run; then 2^20 subsets
// of a 20-term pool exhaustively on one thread and on every core.
//   npx tsx scripts/bench-search.ts [rows=1000] [terms=20]
// The data are random (a benchmark needs only their shape).

import { availableParallelism } from 'node:os';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { scoreGrayRange, scoreSubsetRange, subsetProblemFromDesign, noHierarchy } from '../src/core/search/index.ts';
import { runSearch } from '../src/search/workers/index.ts';
import type { DesignMatrix } from '../src/core/types.ts';

const rows = Number(process.argv[2] ?? 1000);
const m = Number(process.argv[3] ?? 20);
let seed = 12345;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const x = Array.from({ length: m }, () => Float64Array.from({ length: rows }, () => uniform() - 0.5));
const y = Float64Array.from({ length: rows }, (_, i) => x[0][i] + 0.5 * x[1][i] - 0.3 * x[2][i] + 0.5 * (uniform() - 0.5));
const designOf = (terms: number[]): DesignMatrix => {
  const high = [new Float64Array(rows).fill(1), ...terms.map((t) => x[t])];
  return { rows, labels: ['(intercept)', ...terms.map((t) => `x${t}`)], high, low: high.map(() => new Float64Array(rows)), intercept: true, termOfColumn: [-1, ...terms] };
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
const t0 = performance.now();
const pooled = await runSearch(problem, settings, { threads });
const pooledSeconds = (performance.now() - t0) / 1000;

const f = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 0 });
console.log(`pool ${m} terms, ${rows} rows, ${f(total)} subsets`);
console.log(`QR refit per subset (src/core/fit), ${sample} sampled: ${f(qrRate)} subsets/s`);
console.log(`Gray-code sweep kernel, 1 thread: ${graySeconds.toFixed(2)} s, ${f(grayRate)} subsets/s, ${(grayRate / qrRate).toFixed(0)}x QR`);
console.log(`counting-order sweep kernel (the service's), 1 thread: ${countingSeconds.toFixed(2)} s, ${f(countingRate)} subsets/s, ${(countingRate / qrRate).toFixed(0)}x QR`);
console.log(`worker pool, ${threads} threads (incl. worker start): ${pooledSeconds.toFixed(2)} s, ${f(total / pooledSeconds)} subsets/s, ${(countingSeconds / pooledSeconds).toFixed(2)}x one thread`);
if (!pooled.ok) console.log('pool refused:', pooled.issue.message);
