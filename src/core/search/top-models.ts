// The best `capacity` subsets seen so far, in a bounded max-heap whose root
// is the worst kept one, so a new subset is compared with one number and
// rejected in O(1) almost always. Ties in the criterion are broken by fewer
// terms, then by the term indices, so the kept set does not depend on the
// order subsets arrive in (worker ranges merge to the single-thread result).

import type { ScoredSubset } from './types.ts';

export function compareSubsets(a: ScoredSubset, b: ScoredSubset): number {
  if (a.value !== b.value) return a.value < b.value ? -1 : 1;
  if (a.terms.length !== b.terms.length) return a.terms.length - b.terms.length;
  for (let i = 0; i < a.terms.length; i++) if (a.terms[i] !== b.terms[i]) return a.terms[i] - b.terms[i];
  return 0;
}

export class TopModels {
  readonly capacity: number;
  private readonly heap: ScoredSubset[] = [];

  constructor(capacity: number) {
    this.capacity = Math.max(0, Math.floor(capacity));
  }

  get full(): boolean {
    return this.heap.length >= this.capacity;
  }

  /** The criterion value a subset must not exceed to be kept (Infinity until full). */
  get threshold(): number {
    return this.full ? (this.heap.length > 0 ? this.heap[0].value : -Infinity) : Infinity;
  }

  offer(s: ScoredSubset): void {
    if (this.capacity === 0) return;
    if (!this.full) {
      this.heap.push(s);
      this.up(this.heap.length - 1);
    } else if (compareSubsets(s, this.heap[0]) < 0) {
      this.heap[0] = s;
      this.down(0);
    }
  }

  /** Kept subsets, best first. */
  sorted(): ScoredSubset[] {
    return [...this.heap].sort(compareSubsets);
  }

  private up(i: number): void {
    const h = this.heap;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (compareSubsets(h[i], h[parent]) <= 0) break;
      [h[i], h[parent]] = [h[parent], h[i]];
      i = parent;
    }
  }

  private down(i: number): void {
    const h = this.heap;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let worst = i;
      if (l < h.length && compareSubsets(h[l], h[worst]) > 0) worst = l;
      if (r < h.length && compareSubsets(h[r], h[worst]) > 0) worst = r;
      if (worst === i) return;
      [h[i], h[worst]] = [h[worst], h[i]];
      i = worst;
    }
  }
}

/** The best `capacity` of several kept lists (worker results). */
export function mergeTopModels(lists: readonly ScoredSubset[][], capacity: number): ScoredSubset[] {
  return lists.flat().sort(compareSubsets).slice(0, capacity);
}

/** The worst value among the best `capacity` of several kept lists: what a subset must beat to enter; null while fewer are known. */
export function keptThreshold(lists: readonly ScoredSubset[][], capacity: number): number | null {
  const merged = mergeTopModels(lists, capacity);
  return merged.length >= capacity && merged.length > 0 ? merged[merged.length - 1].value : null;
}
