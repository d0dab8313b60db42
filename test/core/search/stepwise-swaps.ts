// A reference written apart from src/core/search: ordinary least squares of
// numeric pool columns through the normal equations (centred cross products
// formed here, two-pass; Cholesky), scored by the shared criterion code, and
// stepwise selection with swaps on top of it: from the intercept-only model,
// take at each step the best of adding one term, dropping one, or swapping
// one in for one out, while the criterion falls (the sequential replacement
// of Miller, "Subset Selection in Regression", ch. 3, cited from memory).
// Branch and bound must do at least as well; its answer must also be locally
// best under the same moves.

import { sharedCriterion } from '../../../src/core/search/scorer.ts';
import type { SearchCriterion } from '../../../src/core/search/index.ts';

export class NormalEquations {
  readonly n: number;
  private readonly p: number;
  /** Centred cross products of the pool columns then the response, (p+1) by (p+1), row-major. */
  private readonly c: Float64Array;

  constructor(columns: Record<string, number[]>, pool: readonly string[], response: string) {
    const series = [...pool, response].map((name) => columns[name]);
    this.n = series[0].length;
    this.p = pool.length;
    const q = this.p + 1;
    const means = series.map((v) => v.reduce((s, x) => s + x, 0) / this.n);
    this.c = new Float64Array(q * q);
    for (let i = 0; i < q; i++) {
      for (let j = i; j < q; j++) {
        let s = 0;
        for (let r = 0; r < this.n; r++) s += (series[i][r] - means[i]) * (series[j][r] - means[j]);
        this.c[i * q + j] = this.c[j * q + i] = s;
      }
    }
  }

  /** Residual sum of squares of the response on the intercept and the given pool terms. */
  rss(terms: readonly number[]): number {
    const q = this.p + 1;
    const y = this.p;
    const k = terms.length;
    const l = new Float64Array(k * k);
    for (let j = 0; j < k; j++) {
      let s = this.c[terms[j] * q + terms[j]];
      for (let p = 0; p < j; p++) s -= l[j * k + p] ** 2;
      if (!(s > 0)) throw new Error('pool columns are collinear');
      l[j * k + j] = Math.sqrt(s);
      for (let i = j + 1; i < k; i++) {
        let v = this.c[terms[i] * q + terms[j]];
        for (let p = 0; p < j; p++) v -= l[i * k + p] * l[j * k + p];
        l[i * k + j] = v / l[j * k + j];
      }
    }
    let explained = 0;
    const z = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      let v = this.c[terms[i] * q + y];
      for (let p = 0; p < i; p++) v -= l[i * k + p] * z[p];
      z[i] = v / l[i * k + i];
      explained += z[i] * z[i];
    }
    return this.c[y * q + y] - explained;
  }

  /** The criterion with k = terms + intercept + error variance. */
  value(criterion: SearchCriterion, terms: readonly number[]): number {
    return sharedCriterion(criterion, this.n, 0, this.rss(terms), terms.length + 2);
  }
}

/** Every subset one add, drop or swap away from `terms` (sorted term lists). */
export function neighbours(terms: readonly number[], poolSize: number): number[][] {
  const inside = new Set(terms);
  const outside = [...Array(poolSize).keys()].filter((t) => !inside.has(t));
  const sorted = (list: number[]) => list.sort((a, b) => a - b);
  const out: number[][] = outside.map((t) => sorted([...terms, t]));
  for (const j of terms) {
    const rest = terms.filter((t) => t !== j);
    out.push(rest);
    for (const t of outside) out.push(sorted([...rest, t]));
  }
  return out;
}

export function stepwiseWithSwaps(model: NormalEquations, poolSize: number, criterion: SearchCriterion): { terms: number[]; value: number; moves: number } {
  let terms: number[] = [];
  let value = model.value(criterion, terms);
  let moves = 0;
  for (;;) {
    let best: { terms: number[]; value: number } | null = null;
    for (const candidate of neighbours(terms, poolSize)) {
      const v = model.value(criterion, candidate);
      if (best === null || v < best.value) best = { terms: candidate, value: v };
    }
    if (best === null || !(best.value < value)) return { terms, value, moves };
    ({ terms, value } = best);
    moves++;
  }
}
