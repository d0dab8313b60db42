// A wide pool for subset searches, invented for the benchmarks and tests of
// branch and bound: a polymer extrusion line logs `terms` process readings
// (r01, r02, ...) per batch, and the melt-flow index of the batch depends on
// eight of them. Readings come in groups of eight sharing a drift (a line
// state), so they are mildly correlated: by default about 0.4 within a group
// and 0.15 between groups, through a plant-wide factor (`groupShare` raises
// the within-group part for harder cases). Seeded, so every run draws the
// same data.
//   meltFlow = 12 + sum over the eight real readings of beta_j * r_j + N(0, 1)
// The eight effects range from strong to faint (t about 3 at 2,000 rows),
// so the best subsets are not a foregone conclusion.

import { seededNormal, seededUniform } from './seeded-random.ts';

/** The real effects: reading index (0-based, spread over the groups) and coefficient. */
const EFFECTS: [number, number][] = [
  [2, 0.8],
  [11, -0.6],
  [17, 0.45],
  [23, 0.35],
  [28, -0.28],
  [5, 0.2],
  [34, 0.14],
  [14, -0.09],
];

export interface WidePool {
  columns: Record<string, number[]>;
  response: 'meltFlow';
  /** Reading names r01.. in column order: the pool. */
  pool: string[];
  /** Pool indices of the readings that carry an effect. */
  real: number[];
}

export interface WidePoolOptions {
  terms?: number;
  rows?: number;
  seed?: number;
  /** Share of each reading's variance from its group's drift (default 0.25; the plant takes 0.15, the rest is its own). */
  groupShare?: number;
}

export function widePool({ terms = 40, rows = 2000, seed = 20260418, groupShare = 0.25 }: WidePoolOptions = {}): WidePool {
  if (!(groupShare >= 0 && groupShare <= 0.85)) throw new RangeError('groupShare is in [0, 0.85]');
  const uniform = seededUniform(seed);
  const normal = seededNormal(uniform);
  const pool = Array.from({ length: terms }, (_, j) => `r${String(j + 1).padStart(2, '0')}`);
  const groups = Math.ceil(terms / 8);
  const x: number[][] = pool.map(() => []);
  const y: number[] = [];
  const effects = EFFECTS.filter(([j]) => j < terms);
  for (let i = 0; i < rows; i++) {
    // Variance shares: plant 0.15, group groupShare, own the rest: within-group correlation 0.15 + groupShare, between 0.15.
    const plant = normal();
    const group = Array.from({ length: groups }, () => normal());
    for (let j = 0; j < terms; j++) {
      x[j].push(Math.sqrt(0.15) * plant + Math.sqrt(groupShare) * group[Math.floor(j / 8)] + Math.sqrt(0.85 - groupShare) * normal());
    }
    y.push(12 + effects.reduce((s, [j, b]) => s + b * x[j][i], 0) + normal());
  }
  const columns: Record<string, number[]> = { meltFlow: y };
  pool.forEach((name, j) => (columns[name] = x[j]));
  return { columns, response: 'meltFlow', pool, real: effects.map(([j]) => j) };
}
