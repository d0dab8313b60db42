// Subsets per second of the search kernels against refitting each subset by
// QR on the rows (src/core/fit), measured in the same run; then 2^20 subsets
// of a 20-term pool exhaustively on one thread and on every core.
//   npx tsx scripts/bench-search.ts [rows=1000] [terms=20] [streamRows=1e7]
// Last, peak memory (resident set) while 10^7 generated NDJSON rows are
// folded into a data summary by the streaming upload's code, in process.
// The data are random (a benchmark needs only their shape).

import { availableParallelism } from 'node:os';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { scoreGrayRange, scoreSubsetRange, subsetProblemFromDesign, noHierarchy } from '../src/core/search/index.ts';
import { runSearch } from '../src/search/workers/index.ts';
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
const t0 = performance.now();
const pooled = await runSearch(problem, settings, { threads });
const pooledSeconds = (performance.now() - t0) / 1000;
// Workers start per search (and, run from sources, load the TypeScript loader): a second run shows the same cost again.
const t1 = performance.now();
await runSearch(problem, settings, { threads });
const pooledAgainSeconds = (performance.now() - t1) / 1000;

const f = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 0 });
console.log(`pool ${m} terms, ${rows} rows, ${f(total)} subsets`);
console.log(`QR refit per subset (src/core/fit), ${sample} sampled: ${f(qrRate)} subsets/s`);
console.log(`Gray-code sweep kernel, 1 thread: ${graySeconds.toFixed(2)} s, ${f(grayRate)} subsets/s, ${(grayRate / qrRate).toFixed(0)}x QR`);
console.log(`counting-order sweep kernel (the service's), 1 thread: ${countingSeconds.toFixed(2)} s, ${f(countingRate)} subsets/s, ${(countingRate / qrRate).toFixed(0)}x QR`);
console.log(`worker pool, ${threads} threads (incl. worker start): ${pooledSeconds.toFixed(2)} s, ${f(total / pooledSeconds)} subsets/s, ${(countingSeconds / pooledSeconds).toFixed(2)}x one thread`);
console.log(`worker pool again: ${pooledAgainSeconds.toFixed(2)} s`);
if (!pooled.ok) console.log('pool refused:', pooled.issue.message);

// Streaming fold: the body is generated chunk by chunk (never held whole), as a client would send it.
const streamRows = Number(process.argv[4] ?? 1e7);
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
