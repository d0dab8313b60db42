// Akaike weights over millions of subsets without overflow or underflow:
// sums of exp(-(value - min)/2) against a running minimum, rescaled when a
// new minimum arrives (the streaming form of log-sum-exp). Per-term sums
// give importance (the summed weight of the subsets holding the term).

import type { WeightSumsData } from './types.ts';

export class WeightSums {
  min = Infinity;
  total = 0;
  readonly perTerm: Float64Array;

  constructor(terms: number) {
    this.perTerm = new Float64Array(terms);
  }

  /** Adds a subset with criterion `value` holding the terms flagged 1 in `members`. */
  add(value: number, members: Uint8Array): void {
    if (value < this.min) {
      const scale = this.min === Infinity ? 0 : Math.exp(-(this.min - value) / 2);
      this.total *= scale;
      for (let t = 0; t < this.perTerm.length; t++) this.perTerm[t] *= scale;
      this.min = value;
    }
    const e = Math.exp(-(value - this.min) / 2);
    this.total += e;
    const p = this.perTerm;
    for (let t = 0; t < p.length; t++) p[t] += e * members[t];
  }

  toData(): WeightSumsData {
    return { min: this.min, total: this.total, perTerm: Array.from(this.perTerm) };
  }
}

/** Combines the sums of disjoint sets of subsets. */
export function mergeWeightSums(parts: readonly WeightSumsData[], terms: number): WeightSumsData {
  const min = parts.reduce((m, p) => Math.min(m, p.min), Infinity);
  const out: WeightSumsData = { min, total: 0, perTerm: new Array<number>(terms).fill(0) };
  if (min === Infinity) return out;
  for (const p of parts) {
    if (p.min === Infinity) continue;
    const scale = Math.exp(-(p.min - min) / 2);
    out.total += p.total * scale;
    for (let t = 0; t < terms; t++) out.perTerm[t] += p.perTerm[t] * scale;
  }
  return out;
}
