// Influence of single rows on a fit.

/**
 * Cook's (1977) distance D_i = (w_i e_i^2 / (p s^2)) * h_ii / (1 - h_ii)^2,
 * with p the rank of the design and s^2 = RSS / (n - p). Null for a row of
 * leverage 1, where it is undefined, and for every row when p = 0: with no
 * estimated coefficients no fitted value moves and D is 0/0.
 */
export function cooksDistances(
  residuals: ArrayLike<number>,
  leverages: ArrayLike<number>,
  rank: number,
  sigma: number,
  weights?: ArrayLike<number>,
  unitLeverageTolerance = 1e-9,
): (number | null)[] {
  const out: (number | null)[] = [];
  if (rank === 0) return Array.from({ length: residuals.length }, () => null);
  const scale = rank * sigma * sigma;
  for (let i = 0; i < residuals.length; i++) {
    const h = leverages[i];
    const complement = 1 - h;
    if (complement < unitLeverageTolerance) {
      out.push(null);
      continue;
    }
    const w = weights ? weights[i] : 1;
    out.push(((w * residuals[i] * residuals[i]) / scale) * (h / (complement * complement)));
  }
  return out;
}
