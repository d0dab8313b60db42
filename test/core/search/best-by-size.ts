// The reference for branch and bound on pools too large to refit every
// subset by QR: every subset enumerated, and for each model size the `keep`
// subsets of smallest residual sum of squares. Every criterion of the
// service is n ln RSS + a penalty in k (src/core/scoring/criteria.ts), so within one
// size it orders subsets as RSS does, and the best `keep` by any criterion
// are among these lists: one pass answers all four criteria (the per-size
// view of Furnival & Wilson, 1974). Written apart from src/core/search's
// walks. Subsets in binary counting order; a subset whose lowest LOW terms
// are all out is swept from its parent's matrix, and the 2^LOW subsets that
// differ from it only in those terms are scored from its swept matrix by the
// normal equations of at most LOW columns (RSS(A + G) = RSS(A) - r_G' M_GG^-1 r_G,
// with M and r the cross products left after A is swept in), solved by
// Cholesky: one sweep per 2^LOW subsets. Full-rank subsets only (random
// data), hierarchy by masks.

import { sweepPivot } from '../../../src/core/search/index.ts';
import { sharedCriterion } from '../../../src/core/search/scorer.ts';
import type { SearchCriterion, SubsetProblem } from '../../../src/core/search/index.ts';

export interface SizedSubset {
  terms: number[];
  rss: number;
  /** Design columns, intercept included. */
  rank: number;
}

export function bestBySize(problem: SubsetProblem, keep: number): SizedSubset[] {
  const m = problem.poolBlocks.length;
  const d = problem.dimension;
  if (m > 26) throw new RangeError('the reference enumerates at most 2^26 subsets');
  if (problem.alwaysColumns.length > 0 || problem.poolBlocks.some((b) => b.length !== 1)) throw new RangeError('one column per pool term, no always terms');
  const intercept = problem.intercept ? 1 : 0;
  const levels = Array.from({ length: m + 1 }, () => new Float64Array(d * d));
  levels[0].set(problem.crossProducts);
  const needs = problem.requires.map((r) => r.reduce((mask, j) => mask | (1 << j), 0));
  const blocked = problem.blocked.reduce((mask, b) => mask | (1 << b), 0);
  // Per size, the kept subsets as (rss, mask), worst last.
  const kept: { rss: number; mask: number }[][] = Array.from({ length: m + 1 }, () => []);
  const offer = (size: number, rss: number, mask: number) => {
    const list = kept[size];
    if (list.length === keep && rss >= list[keep - 1].rss) return;
    let at = list.length;
    while (at > 0 && list[at - 1].rss > rss) at--;
    list.splice(at, 0, { rss, mask });
    if (list.length > keep) list.pop();
  };
  const ruled = blocked !== 0 || needs.some((n) => n !== 0);
  const admissible = (mask: number) => !ruled || ((mask & blocked) === 0 && needs.every((n, t) => !((mask >>> t) & 1) || (n & ~mask) === 0));
  const y = d - 1;
  const columns = problem.poolBlocks.map((b) => b[0]);
  const low = Math.min(LOW, m);
  const lowMask = 2 ** low - 1;
  const g = new Float64Array(LOW * LOW);
  const r = new Float64Array(LOW);
  const lowColumns = Array.from({ length: lowMask + 1 }, (_, extra) => columns.slice(0, low).filter((_, t) => (extra >>> t) & 1));
  for (let i = 0; i < 2 ** m; i++) {
    const size = popcount(i);
    const anchor = i & ~lowMask;
    if (i === anchor && i !== 0) {
      const t = 31 - Math.clz32(i & -i);
      levels[size].set(levels[size - 1]);
      sweepPivot(levels[size], d, columns[t], 1);
    }
    const a = levels[popcount(anchor)];
    let rss = a[y * d + y];
    const extra = i & lowMask;
    if (extra !== 0) {
      const cols = lowColumns[extra];
      const k = cols.length;
      for (let p = 0; p < k; p++) {
        r[p] = a[cols[p] * d + y];
        for (let q = 0; q < k; q++) g[p * LOW + q] = a[cols[p] * d + cols[q]];
      }
      rss -= quadraticForm(g, r, k);
    }
    if (admissible(i)) offer(size, rss, i);
  }
  return kept.flatMap((list, size) =>
    list.map(({ rss, mask }) => ({ terms: [...Array(m).keys()].filter((t) => (mask >>> t) & 1), rss, rank: size + intercept })),
  );
}

/** The best `top` of the per-size lists by a criterion, ties broken as the search breaks them (fewer terms, then indices). */
export function bestByCriterion(problem: SubsetProblem, lists: SizedSubset[], criterion: SearchCriterion, top: number) {
  const scored = lists
    .map((s) => ({ ...s, value: sharedCriterion(criterion, problem.observations, problem.logWeightSum, s.rss, s.rank + 1) }))
    .filter((s) => !Number.isNaN(s.value));
  scored.sort((a, b) => a.value - b.value || a.terms.length - b.terms.length || compareTerms(a.terms, b.terms));
  return scored.slice(0, top);
}

/** Low terms scored by small solves from their anchor's matrix. */
const LOW = 4;

/** r' G^-1 r for the leading k-by-k block of G (row stride LOW), by Cholesky; G is positive definite here. */
const l = new Float64Array(LOW * LOW);
const z = new Float64Array(LOW);
function quadraticForm(g: Float64Array, r: Float64Array, k: number): number {
  for (let j = 0; j < k; j++) {
    let s = g[j * LOW + j];
    for (let p = 0; p < j; p++) s -= l[j * LOW + p] ** 2;
    const diag = Math.sqrt(s);
    l[j * LOW + j] = diag;
    for (let i = j + 1; i < k; i++) {
      let v = g[i * LOW + j];
      for (let p = 0; p < j; p++) v -= l[i * LOW + p] * l[j * LOW + p];
      l[i * LOW + j] = v / diag;
    }
  }
  // ||L^-1 r||^2 by forward substitution.
  let sum = 0;
  for (let i = 0; i < k; i++) {
    let v = r[i];
    for (let p = 0; p < i; p++) v -= l[i * LOW + p] * z[p];
    z[i] = v / l[i * LOW + i];
    sum += z[i] * z[i];
  }
  return sum;
}

function compareTerms(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

function popcount(x: number): number {
  let v = x - ((x >>> 1) & 0x55555555);
  v = (v & 0x33333333) + ((v >>> 2) & 0x33333333);
  return (((v + (v >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}
