// One large least-squares fit (default 100,000 rows x 30 columns plus the
// intercept) timed beside numpy.linalg.lstsq on the same data and beside the
// plain double Householder QR (src/core/fit/plain-householder.ts), all in the
// same run; prints the best of a few repetitions and the ratios.
//   npx tsx scripts/bench-large-fit.ts [rows=100000] [columns=30] [repeats=5]
// numpy runs under /usr/bin/python3 (Debian's, which has numpy); the design and
// response go to a temporary file as raw little-endian float64. The data are
// random from a seeded generator (a benchmark needs only their shape).

import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildDesign } from '../src/core/design/index.ts';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { fitPlainHouseholder } from '../src/core/fit/plain-householder.ts';
import type { Columns } from '../src/core/types.ts';
import { largeFitData } from './large-fit-data.ts';

const rows = Number(process.argv[2] ?? 100_000);
const m = Number(process.argv[3] ?? 30);
const repeats = Number(process.argv[4] ?? 5);

const { names, columns, y } = largeFitData(rows, m);
const built = buildDesign(columns as Columns, names, true, Array.from({ length: rows }, (_, i) => i));
if ('issues' in built) throw new Error(JSON.stringify(built.issues.slice(0, 3)));
const design = built.design;
const p = design.labels.length;

function best(f: () => void): number {
  let min = Infinity;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    f();
    min = Math.min(min, (performance.now() - t0) / 1000);
  }
  return min;
}

// Row-major design then y, as numpy reads it.
const dir = mkdtempSync(join(tmpdir(), 'parsimetry-bench-'));
const file = join(dir, 'design.f64');
const flat = new Float64Array(rows * (p + 1));
for (let i = 0; i < rows; i++) {
  for (let j = 0; j < p; j++) flat[i * p + j] = design.high[j][i];
}
flat.set(y, rows * p);
writeFileSync(file, new Uint8Array(flat.buffer));
const python = `
import sys, time, numpy as np
n, p, reps = ${rows}, ${p}, ${repeats}
data = np.fromfile(sys.argv[1], dtype='<f8')
X = data[: n * p].reshape(n, p).copy()
y = data[n * p :].copy()
best = float('inf')
for _ in range(reps):
    t0 = time.perf_counter()
    np.linalg.lstsq(X, y, rcond=None)
    best = min(best, time.perf_counter() - t0)
print(best, np.__version__)
`;
// numpy twice: with its BLAS on one thread (like this single-threaded fit) and
// with the BLAS's default threads.
const runNumpy = (threads: string | null): [number, string] => {
  const env = { ...process.env };
  for (const v of ['OPENBLAS_NUM_THREADS', 'OMP_NUM_THREADS', 'MKL_NUM_THREADS']) {
    if (threads === null) delete env[v];
    else env[v] = threads;
  }
  const out = execFileSync('/usr/bin/python3', ['-c', python, file], { encoding: 'utf8', env });
  const [seconds, version] = out.trim().split(/\s+/);
  return [Number(seconds), version];
};
let numpy1: number;
let numpyDefault: number;
let numpyVersion: string;
try {
  [numpy1, numpyVersion] = runNumpy('1');
  [numpyDefault] = runNumpy(null);
} finally {
  rmSync(dir, { recursive: true, force: true });
}

const fitSeconds = best(() => fitLeastSquares(design, y));
const plainSeconds = best(() => fitPlainHouseholder(design, y));

const line = (what: string, seconds: number) =>
  console.log(`${what.padEnd(44)} ${seconds.toFixed(3).padStart(8)} s   ${(fitSeconds / seconds).toFixed(2).padStart(7)}`);
console.log(`n = ${rows}, p = ${p}, best of ${repeats}; last column: fitLeastSquares time / this time`);
line(`numpy ${numpyVersion} lstsq, one BLAS thread`, numpy1);
line(`numpy ${numpyVersion} lstsq, default BLAS threads`, numpyDefault);
line('plain Householder QR (double, no refinement)', plainSeconds);
line('fitLeastSquares', fitSeconds);
