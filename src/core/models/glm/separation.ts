// Separation: the likelihood of a binomial or count model rising without
// bound as some coefficients run to infinity, so that no maximum-likelihood
// estimate exists (Albert & Anderson 1984 for the binomial, complete and
// quasi-complete; Haberman 1974 for log-linear counts, e.g. a factor level
// whose counts are all zero). IRLS then still "converges" by the deviance
// rule, with huge estimates and standard errors; those are never reported.
//
// A direction d is a proof of separation when, for every row, x'd > 0 only
// where y equals its trials, x'd < 0 only where y = 0, x'd = 0 elsewhere, and
// X d ≠ 0 (for log-linear counts: x'd <= 0, and < 0 only where y = 0): along
// d every row's likelihood rises or stays, so the supremum is not attained.
// The candidate d is IRLS's last step, which under separation keeps a fixed
// size along the escaping direction while the rest has converged. It is made
// exact by removing its component in the row space of the rows it leaves
// still (a least-squares fit of X_still d on X_still), and then checked row
// by row; the terms involved are the columns d moves. Nothing is claimed
// without the check passing, so a false alarm needs a genuine separating
// direction.
import type { DesignMatrix } from '../../types.ts';
import { fitLeastSquares } from '../../fit/index.ts';
import type { GlmFamilyName, GlmLinkName } from './types.ts';
import { linearPredictor } from './irls.ts';

/** Rows moving by less than this fraction of the largest move are taken as still. */
const STILL_ROW = 1e-6;
/** After projection, still rows must be below this fraction of the largest move. */
const STILL_AFTER_PROJECTION = 1e-8;
/** Columns contributing less than this fraction of the largest contribution are not involved. */
const INVOLVED_COLUMN = 1e-8;

export interface Separation {
  /** Design columns whose coefficients run to infinity. */
  columns: number[];
  /** Rows fitted ever closer to their bound. */
  rows: number;
}

/** Whether the family and link can separate: a mean that reaches its bound only as η → ±∞. */
export function canSeparate(family: GlmFamilyName, link: GlmLinkName): boolean {
  if (family === 'binomial') return link === 'logit' || link === 'probit' || link === 'cloglog';
  return (family === 'poisson' || family === 'negativeBinomial') && link === 'log';
}

function rowsOf(design: DesignMatrix, keep: number[]): DesignMatrix {
  const pick = (col: Float64Array) => Float64Array.from(keep, (i) => col[i]);
  return { ...design, rows: keep.length, high: design.high.map(pick), low: design.low.map(pick) };
}

/** The sign a moving row may take: +1 (y at its trials), -1 (y = 0), 0 (neither: the row cannot move). */
function allowedSign(family: GlmFamilyName, y: number, trials: number): number {
  if (y === 0) return -1;
  return family === 'binomial' && y === trials ? 1 : 0;
}

function moves(v: Float64Array): number {
  let max = 0;
  for (let i = 0; i < v.length; i++) max = Math.max(max, Math.abs(v[i]));
  return max;
}

export function findSeparation(
  design: DesignMatrix,
  family: GlmFamilyName,
  y: Float64Array,
  prior: Float64Array,
  step: Float64Array | null,
): Separation | null {
  if (!step || step.every((b) => b === 0)) return null;
  const n = design.rows;
  const v = new Float64Array(n);
  linearPredictor(design, step, null, v);
  let largest = moves(v);
  if (!(largest > 0)) return null;
  const still: number[] = [];
  for (let i = 0; i < n; i++) {
    if (Math.abs(v[i]) <= STILL_ROW * largest) still.push(i);
    else if (Math.sign(v[i]) !== allowedSign(family, y[i], prior[i])) return null;
  }
  let d = step;
  if (still.length > 0) {
    const part = rowsOf(design, still);
    const target = Float64Array.from(still, (i) => v[i]);
    const e = fitLeastSquares(part, target).coefficients;
    d = Float64Array.from(step, (b, j) => b - (e[j] ?? 0));
    linearPredictor(design, d, null, v);
    largest = moves(v);
    if (!(largest > 0)) return null;
  }
  let moving = 0;
  for (let i = 0; i < n; i++) {
    if (Math.abs(v[i]) <= STILL_AFTER_PROJECTION * largest) continue;
    if (Math.sign(v[i]) !== allowedSign(family, y[i], prior[i])) return null;
    moving++;
  }
  // A column is involved by its contribution |d_j| max|x_j|, which is free of the column's units.
  const size = d.map((b, j) => {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, Math.abs(design.high[j][i]));
    return Math.abs(b) * m;
  });
  const top = Math.max(...size);
  const columns = [...size.keys()].filter((j) => size[j] > INVOLVED_COLUMN * top);
  return { columns, rows: moving };
}
