// Means and centred cross products of columns, by the corrected two-pass
// algorithm: pass one forms the means, pass two the sums of products of
// deviations, with the correction term -(sum d_j)(sum d_k)/W that removes
// the rounding left in the means (Chan, Golub & LeVeque 1983, "corrected
// two-pass"). Two passes are more accurate than Welford's one-pass update
// and, over column-major typed arrays, faster in JS; the one-pass
// sum(xz) - n*mean(x)*mean(z) form is never used because it cancels
// catastrophically when means are large against spreads (peakTemp ~ 1200 °C
// with a spread of a few degrees loses ~6 of 16 digits).

import type { DataSummary } from './types.ts';

export function summariseRows(
  columns: readonly Float64Array[],
  weights?: Float64Array | null,
  names?: readonly string[],
): DataSummary {
  const p = columns.length;
  const n = p === 0 ? (weights?.length ?? 0) : columns[0].length;
  let weightSum = n;
  let sumLog = 0;
  if (weights) {
    weightSum = 0;
    for (let i = 0; i < n; i++) {
      weightSum += weights[i];
      sumLog += Math.log(weights[i]);
    }
  }
  const means: number[] = [];
  const deviations: Float64Array[] = [];
  const deviationSums: number[] = [];
  for (let j = 0; j < p; j++) {
    const x = columns[j];
    let s = 0;
    if (weights) for (let i = 0; i < n; i++) s += weights[i] * x[i];
    else for (let i = 0; i < n; i++) s += x[i];
    let mean = s / weightSum;
    // Second pass on the mean: one step of refinement for the rounding in s.
    let r = 0;
    if (weights) for (let i = 0; i < n; i++) r += weights[i] * (x[i] - mean);
    else for (let i = 0; i < n; i++) r += x[i] - mean;
    mean += r / weightSum;
    const d = new Float64Array(n);
    let ds = 0;
    for (let i = 0; i < n; i++) {
      d[i] = x[i] - mean;
      ds += weights ? weights[i] * d[i] : d[i];
    }
    means.push(mean);
    deviations.push(d);
    deviationSums.push(ds);
  }
  const cross: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    const a = deviations[j];
    // Weighted: fold w into one factor once per column pair's left side.
    const aw = weights ? a.map((v, i) => v * weights[i]) : a;
    for (let k = 0; k <= j; k++) {
      const b = deviations[k];
      let s = 0;
      for (let i = 0; i < n; i++) s += aw[i] * b[i];
      const c = s - (deviationSums[j] * deviationSums[k]) / weightSum;
      cross[j][k] = c;
      cross[k][j] = c;
    }
  }
  const summary: DataSummary = {
    rows: n,
    columns: names ? [...names] : columns.map((_, j) => `column${j + 1}`),
    means,
    centredCrossProducts: cross,
  };
  if (weights) summary.weights = { sum: weightSum, sumLog };
  return summary;
}
