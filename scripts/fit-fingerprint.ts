// Prints a SHA-256 of every number fitLeastSquares returns on the NIST StRD
// linear sets and on synthetic weighted, aliased and wide designs, so that a
// change to the fit's kernels can be checked bit-for-bit against the previous
// commit (run it on both, diff the output). Usage: npx tsx scripts/fit-fingerprint.ts

import { createHash } from 'node:crypto';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { buildDesign } from '../src/core/design/index.ts';
import type { Columns } from '../src/core/types.ts';
import { STRD_FILES, loadStrd, strdDesign } from '../test/reference/nist/strd.ts';

function digest(value: unknown): string {
  const json = JSON.stringify(value, (_k, v) =>
    v instanceof Float64Array ? Array.from(v) : v instanceof Map ? [...v] : v);
  return createHash('sha256').update(json).digest('hex').slice(0, 16);
}

let seed = 20261202;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);

function synthetic(rows: number, p: number, aliasedCopy: boolean) {
  const names = Array.from({ length: p }, (_, j) => `x${j}`);
  const columns: Record<string, number[]> = {};
  for (const name of names) columns[name] = Array.from({ length: rows }, () => 10 * (uniform() - 0.3));
  if (aliasedCopy) columns[names[p - 1]] = columns[names[0]].map((v, i) => 2 * v - columns[names[1]][i]);
  const y = Float64Array.from({ length: rows }, (_, i) =>
    names.reduce((s, name, j) => s + (j - p / 2) * 0.1 * columns[name][i], 3) + (uniform() - 0.5));
  const built = buildDesign(columns as Columns, names, true, Array.from({ length: rows }, (_, i) => i));
  if ('issues' in built) throw new Error('synthetic design failed');
  return { design: built.design, y };
}

const lines: string[] = [];
for (const file of STRD_FILES) {
  const { design, y } = strdDesign(loadStrd(file));
  lines.push(`${file} ${digest(fitLeastSquares(design, y))}`);
}
for (const [rows, p, alias] of [[200, 5, false], [3000, 12, true], [20000, 30, false]] as const) {
  const { design, y } = synthetic(rows, p, alias);
  const w = Float64Array.from({ length: rows }, (_, i) => (i % 17 === 0 ? 0 : 0.5 + uniform()));
  lines.push(`synthetic ${rows}x${p}${alias ? ' aliased' : ''} ${digest(fitLeastSquares(design, y))}`);
  lines.push(`synthetic ${rows}x${p}${alias ? ' aliased' : ''} weighted ${digest(fitLeastSquares(design, y, w))}`);
  lines.push(`synthetic ${rows}x${p} no refinement ${digest(fitLeastSquares(design, y, undefined, { maxRefinementSteps: 0 }))}`);
}
console.log(lines.join('\n'));
