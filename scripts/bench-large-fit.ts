// One large least-squares fit (default 100,000 rows x 30 columns plus the
// intercept) timed beside numpy.linalg.lstsq on the same data and beside the
// plain double Householder QR (src/core/fit/plain-householder.ts), all in the
// same run. The machine is shared, so the run is split into rounds; each round
// times every contender (best of a few repetitions, wall clock and CPU time of
// the process) and the ratios are taken within the round; the medians over the
// rounds are printed last.
//   npx tsx scripts/bench-large-fit.ts [rows=100000] [columns=30] [repeats=3] [rounds=5]
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
const repeats = Number(process.argv[4] ?? 3);
const rounds = Number(process.argv[5] ?? 5);

const { names, columns, y } = largeFitData(rows, m);
const built = buildDesign(columns as Columns, names, true, Array.from({ length: rows }, (_, i) => i));
if ('issues' in built) throw new Error(JSON.stringify(built.issues.slice(0, 3)));
const design = built.design;
const p = design.labels.length;

const cpuSeconds = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
};

/** Best wall-clock and best CPU seconds of `repeats` calls. */
function best(f: () => void): Timing {
  let wall = Infinity;
  let cpu = Infinity;
  for (let r = 0; r < repeats; r++) {
    const w0 = performance.now();
    const c0 = cpuSeconds();
    f();
    cpu = Math.min(cpu, cpuSeconds() - c0);
    wall = Math.min(wall, (performance.now() - w0) / 1000);
  }
  return { wall, cpu };
}

interface Timing {
  wall: number;
  cpu: number;
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
wall = cpu = float('inf')
for _ in range(reps):
    t0, c0 = time.perf_counter(), time.process_time()
    np.linalg.lstsq(X, y, rcond=None)
    cpu = min(cpu, time.process_time() - c0)
    wall = min(wall, time.perf_counter() - t0)
print(wall, cpu, np.__version__)
`;
// numpy twice: with its BLAS on one thread (like this single-threaded fit) and
// with the BLAS's default threads (whose CPU time counts every thread).
let numpyVersion = '';
const runNumpy = (threads: string | null): Timing => {
  const env = { ...process.env };
  for (const v of ['OPENBLAS_NUM_THREADS', 'OMP_NUM_THREADS', 'MKL_NUM_THREADS']) {
    if (threads === null) delete env[v];
    else env[v] = threads;
  }
  const out = execFileSync('/usr/bin/python3', ['-c', python, file], { encoding: 'utf8', env });
  const [wall, cpu, version] = out.trim().split(/\s+/);
  numpyVersion = version;
  return { wall: Number(wall), cpu: Number(cpu) };
};

const contenders = ['numpy lstsq, one BLAS thread', 'numpy lstsq, default BLAS threads', 'plain Householder QR (double, no refinement)', 'fitLeastSquares'];
/** Per contender, per round: fitLeastSquares time / this time, wall and CPU. */
const ratios = contenders.map(() => ({ wall: [] as number[], cpu: [] as number[] }));
try {
  for (let round = 0; round < rounds; round++) {
    const times = [runNumpy('1'), runNumpy(null), best(() => fitPlainHouseholder(design, y)), best(() => fitLeastSquares(design, y))];
    const fit = times[3];
    console.log(`round ${round + 1}: ${times.map((t, i) => `${contenders[i].split(',')[0].split(' (')[0]}${i === 0 ? ' 1 thread' : i === 1 ? ' default' : ''} ${t.wall.toFixed(3)} s wall, ${t.cpu.toFixed(3)} s CPU`).join('; ')}`);
    times.forEach((t, i) => {
      ratios[i].wall.push(fit.wall / t.wall);
      ratios[i].cpu.push(fit.cpu / t.cpu);
    });
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
console.log(`n = ${rows}, p = ${p}, numpy ${numpyVersion}, ${rounds} rounds of best of ${repeats}; fitLeastSquares time / this time, median over the rounds (range)`);
console.log(`${''.padEnd(46)} ${'wall'.padStart(18)} ${'CPU'.padStart(18)}`);
const cell = (xs: number[]) => `${median(xs).toFixed(2)} (${Math.min(...xs).toFixed(2)}-${Math.max(...xs).toFixed(2)})`.padStart(18);
contenders.forEach((name, i) => console.log(`${name.padEnd(46)} ${cell(ratios[i].wall)} ${cell(ratios[i].cpu)}`));
