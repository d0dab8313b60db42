// A subset of at most 52 pool terms as one exact number, sum of 2^t over its
// terms (doubles hold integers to 2^53), and the few subsets a stepwise start
// has already counted, so branch and bound can pass them over in O(1) and
// take them out of a pruned subtree's count exactly.

const TWO32 = 2 ** 32;

/** Most pool terms a key holds exactly. */
export const MAX_KEYED_TERMS = 52;

export function subsetKey(members: Uint8Array): number {
  let key = 0;
  for (let t = 0; t < members.length; t++) if (members[t]) key += 2 ** t;
  return key;
}

export function keyOfTerms(terms: readonly number[]): number {
  return terms.reduce((key, t) => key + 2 ** t, 0);
}

export class CountedSubsets {
  private readonly keys: Set<number>;
  private readonly lo: Uint32Array;
  private readonly hi: Uint32Array;

  constructor(subsets: readonly number[][]) {
    const keys = subsets.map(keyOfTerms);
    this.keys = new Set(keys);
    this.lo = Uint32Array.from(keys, (k) => k % TWO32);
    this.hi = Uint32Array.from(keys, (k) => Math.floor(k / TWO32));
  }

  has(key: number): boolean {
    return this.keys.size > 0 && this.keys.has(key);
  }

  /** How many counted subsets lie strictly between `lower` and `upper` (supersets of one, subsets of the other, neither itself). */
  inside(lower: number, upper: number): number {
    if (this.keys.size === 0) return 0;
    const lowLo = lower % TWO32;
    const lowHi = Math.floor(lower / TWO32);
    const upLo = upper % TWO32;
    const upHi = Math.floor(upper / TWO32);
    let n = 0;
    for (let i = 0; i < this.lo.length; i++) {
      const lo = this.lo[i];
      const hi = this.hi[i];
      if ((lo & lowLo) >>> 0 !== lowLo || (hi & lowHi) >>> 0 !== lowHi) continue;
      if ((lo & ~upLo) >>> 0 !== 0 || (hi & ~upHi) >>> 0 !== 0) continue;
      const key = hi * TWO32 + lo;
      if (key !== lower && key !== upper) n++;
    }
    return n;
  }
}
