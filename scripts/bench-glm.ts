// Speed of generalised linear model fits against least squares of the same
// design, measured in one run, and against statsmodels' GLM on the same data
// where Debian's /usr/bin/python3 has it (the goal: a ratio >= 1, as fast or
// faster). Also checks that the two agree on the estimates.
//   npx tsx scripts/bench-glm.ts [rows=100000] [columns=30] [repeats=3]
// The data come from a seeded generator: the benchmark needs their shape, and
// the statsmodels run reads the very same numbers from a temporary file.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildDesign } from '../src/core/design/index.ts';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { fitGlm, type GlmFit } from '../src/core/models/glm/index.ts';
import type { Columns } from '../src/core/types.ts';

const rows = Number(process.argv[2] ?? 100_000);
const width = Number(process.argv[3] ?? 30);
const repeats = Number(process.argv[4] ?? 3);
const m = width - 1;

let seed = 20240615;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) + 0.5) / 4294967296;
const names = Array.from({ length: m }, (_, j) => `x${j}`);
const columns: Record<string, number[]> = {};
for (const name of names) columns[name] = Array.from({ length: rows }, () => uniform() - 0.5);
const eta = Array.from({ length: rows }, (_, i) => {
  let s = -0.3;
  names.forEach((name, j) => { s += ((j % 5) - 2) * 0.4 * columns[name][i]; });
  return s;
});
const binary = Float64Array.from(eta, (e) => (uniform() < 1 / (1 + Math.exp(-e)) ? 1 : 0));
// Poisson by inversion of its distribution function (means here are below ~20).
const counts = Float64Array.from(eta, (e) => {
  const mu = Math.exp(e + 1);
  let k = 0;
  let p = Math.exp(-mu);
  let cdf = p;
  const u = uniform();
  while (u > cdf && k < 1000) {
    k++;
    p *= mu / k;
    cdf += p;
  }
  return k;
});
const allRows = Array.from({ length: rows }, (_, i) => i);
const built = buildDesign(columns as Columns, names, true, allRows);
if ('issues' in built) throw new Error(JSON.stringify(built.issues.slice(0, 3)));
const design = built.design;

function best<T>(f: () => T): [T, number] {
  let result!: T;
  let fastest = Infinity;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    result = f();
    fastest = Math.min(fastest, (performance.now() - t0) / 1000);
  }
  return [result, fastest];
}
const fit = (family: 'binomial' | 'poisson', y: Float64Array) => {
  const f = fitGlm({ family, design, response: y });
  if ('issues' in f) throw new Error(f.issues[0].message);
  return f;
};

const [, lsSeconds] = best(() => fitLeastSquares(design, binary));
const [logit, logitSeconds] = best(() => fit('binomial', binary));
const [poisson, poissonSeconds] = best(() => fit('poisson', counts));

interface Reference { seconds: number; iterations: number; coefficients: number[] }
function statsmodels(): { version: string; logit: Reference; poisson: Reference } | null {
  const dir = mkdtempSync(join(tmpdir(), 'bench-glm-'));
  try {
    const x = new Float64Array(rows * m);
    names.forEach((name, j) => columns[name].forEach((v, i) => { x[i * m + j] = v; }));
    writeFileSync(join(dir, 'x.bin'), Buffer.from(x.buffer));
    writeFileSync(join(dir, 'binary.bin'), Buffer.from(binary.buffer));
    writeFileSync(join(dir, 'counts.bin'), Buffer.from(counts.buffer));
    const program = `
import json, sys, time
import numpy as np, statsmodels, statsmodels.api as sm
d, n, m, repeats = sys.argv[1], int(sys.argv[2]), int(sys.argv[3]), int(sys.argv[4])
X = np.column_stack([np.ones(n), np.fromfile(d + '/x.bin').reshape(n, m)])
out = {'version': 'statsmodels ' + statsmodels.__version__ + ', numpy ' + np.__version__}
for name, file, family in (('logit', 'binary', sm.families.Binomial()), ('poisson', 'counts', sm.families.Poisson())):
    y = np.fromfile(d + '/' + file + '.bin')
    fastest = float('inf')
    for r in range(repeats):
        t0 = time.perf_counter()
        res = sm.GLM(y, X, family=family).fit()
        fastest = min(fastest, time.perf_counter() - t0)
    out[name] = {'seconds': fastest, 'iterations': int(res.fit_history['iteration']), 'coefficients': res.params.tolist()}
print(json.dumps(out))
`;
    const text = execFileSync('/usr/bin/python3', ['-c', program, dir, String(rows), String(m), String(repeats)], { encoding: 'utf8' });
    return JSON.parse(text);
  } catch {
    return null;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const largestDifference = (a: GlmFit, b: number[]) =>
  Math.max(...a.coefficients.map((c, j) => Math.abs((c.estimate ?? NaN) - b[j]) / Math.max(Math.abs(b[j]), 1e-3)));
const line = (label: string, seconds: number, note = '') =>
  console.log(`${label.padEnd(42)} ${seconds.toFixed(3).padStart(8)} s   ${(seconds / lsSeconds).toFixed(2).padStart(6)} x least squares${note}`);
console.log(`n = ${rows}, p = ${width} (intercept + ${m} uniform columns); fastest of ${repeats}; figures taken on a shared, busy machine`);
line('fitLeastSquares (baseline)', lsSeconds);
line(`fitGlm binomial/logit (${logit.convergence.iterations} solves)`, logitSeconds);
line(`fitGlm poisson/log (${poisson.convergence.iterations} solves)`, poissonSeconds);
const sm = statsmodels();
if (!sm) {
  console.log('statsmodels: not available at /usr/bin/python3; no comparison');
} else {
  console.log(`\n${sm.version}, GLM().fit() (IRLS), same data`);
  const compare = (label: string, ours: GlmFit, seconds: number, ref: Reference) =>
    console.log(`${label.padEnd(10)} statsmodels ${ref.seconds.toFixed(3)} s (${ref.iterations} iterations), ours ${seconds.toFixed(3)} s: ratio statsmodels/ours ${(ref.seconds / seconds).toFixed(2)}; largest relative difference of the estimates ${largestDifference(ours, ref.coefficients).toExponential(1)}`);
  compare('logit', logit, logitSeconds, sm.logit);
  compare('poisson', poisson, poissonSeconds, sm.poisson);
}
