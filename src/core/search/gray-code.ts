// The binary reflected Gray code: consecutive codes differ in one bit, the
// lowest set bit of the step index, so a walk over all 2^m subsets changes
// one term per step (Gray 1953; Knuth TAOCP 7.2.1.1).

/** The subset (as a bit mask) visited at step i. Valid for i < 2^31. */
export function grayCode(i: number): number {
  return (i ^ (i >>> 1)) >>> 0;
}

/** The term toggled when stepping from i - 1 to i (i >= 1): the index of the lowest set bit of i. */
export function toggledBit(i: number): number {
  return 31 - Math.clz32(i & -i);
}
