// Where one large least-squares fit spends its time, stage by stage: the stages
// of fitLeastSquares called one after another on the same data, each timed by
// the process's CPU time (steadier than wall time on a shared machine), over a
// few rounds; prints the least and the median per stage. The data are random
// from a seeded generator (only their shape matters).
//   npx tsx scripts/profile-large-fit.ts [rows=100000] [columns=30] [rounds=9]
import { buildDesign } from '../src/core/design/index.ts';
import { ALIAS_TOLERANCE, MAX_REFINEMENT_STEPS, fitLeastSquares } from '../src/core/fit/index.ts';
import { equilibrate } from '../src/core/fit/equilibration.ts';
import { applyQ, applyQt, householderQR } from '../src/core/fit/householder-qr.ts';
import { refineLeastSquares } from '../src/core/fit/refinement.ts';
import { conditionFromR } from '../src/core/fit/condition.ts';
import { equilibratedCovariance } from '../src/core/fit/covariance.ts';
import { refinementResiduals } from '../src/core/numeric/dd-vector.ts';
import type { Columns } from '../src/core/types.ts';
import { largeFitData } from './large-fit-data.ts';

const rows = Number(process.argv[2] ?? 100_000);
const m = Number(process.argv[3] ?? 30);
const rounds = Number(process.argv[4] ?? 9);
const { names, columns, y } = largeFitData(rows, m);
const built = buildDesign(columns as Columns, names, true, Array.from({ length: rows }, (_, i) => i));
if ('issues' in built) throw new Error(JSON.stringify(built.issues.slice(0, 3)));
const design = built.design;
const p = design.labels.length;

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const spent = new Map<string, number[]>();
function timed<T>(stage: string, f: () => T): T {
  const c0 = cpuMs();
  const out = f();
  spent.set(stage, [...(spent.get(stage) ?? []), cpuMs() - c0]);
  return out;
}

let steps = 0;
for (let round = 0; round < rounds; round++) {
  const eq = timed('equilibration', () => equilibrate(design, y, undefined, ALIAS_TOLERANCE));
  const candidates = [eq.interceptColumn, ...Array.from({ length: p }, (_, j) => j).filter((j) => j !== eq.interceptColumn)];
  const qr = timed('Householder QR', () => householderQR(eq.ah, rows, candidates, eq.norm, ALIAS_TOLERANCE));
  const accepted = qr.order.slice(0, qr.rank).map((c) => candidates[c]);
  const sol = timed('refinement (all of it)', () => refineLeastSquares(qr, eq.ah, eq.al, accepted, eq.bh, eq.bl, MAX_REFINEMENT_STEPS));
  steps = sol.steps;
  const z = Float64Array.from(eq.bh);
  timed('  of which one Q^T z', () => applyQt(qr, z));
  timed('  of which one Q z', () => applyQ(qr, z));
  const [fh, fl, g] = [new Float64Array(rows), new Float64Array(rows), new Float64Array(qr.rank)];
  timed('  of which one residual pass', () => refinementResiduals(
    accepted.map((c) => eq.ah[c]), accepted.map((c) => eq.al[c]), sol.xh, sol.xl, eq.bh, eq.bl, sol.rh, sol.rl, fh, fl, g));
  const kappa = timed('condition number', () => conditionFromR(qr));
  timed('covariance', () => equilibratedCovariance(qr, eq.ah, eq.al, accepted, kappa, 'auto'));
  timed('fitLeastSquares, whole', () => fitLeastSquares(design, y));
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1];
console.log(`n = ${rows}, p = ${p}, ${rounds} rounds, ${steps} refinement steps after the first solve; CPU ms`);
console.log(`${'stage'.padEnd(30)} ${'least'.padStart(8)} ${'median'.padStart(8)}`);
for (const [stage, xs] of spent) console.log(`${stage.padEnd(30)} ${Math.min(...xs).toFixed(1).padStart(8)} ${median(xs).toFixed(1).padStart(8)}`);
