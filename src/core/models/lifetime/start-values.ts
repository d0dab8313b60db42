// Starting values from least squares on one representative value per row
// (the failure time, the censoring time, or the middle of a window, on the
// model's scale), corrected by the moments of the law: if y = μ + σZ then
// E[y] = μ + σ E[Z] and sd(y) = σ sd(Z). For the gamma on log-time,
// ln t = μ + ln G with var(ln G) = ψ'(κ) and E[ln G] = ψ(κ), so κ solves
// ψ'(κ) = var. Censored rows bias these moments, which is why they are only
// where Newton–Raphson starts.
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import type { Distribution } from './distributions.ts';
import { toFitCoordinates, type ResponseScaling, type StandardisedDesign } from './standardised-problem.ts';

/** κ with ψ'(κ) = variance, by bisection on ln κ (ψ' is decreasing), within e^-7 … e^14. */
export function gammaShapeForLogVariance(variance: number): number {
  let lo = -7;
  let hi = 14;
  if (!(variance > 0)) return Math.exp(hi);
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (trigamma(Math.exp(mid)) > variance) lo = mid;
    else hi = mid;
  }
  return Math.exp((lo + hi) / 2);
}

/**
 * θ' = (γ, s') in the fit's coordinates, from least-squares coefficients
 * (on the data's scale, over the estimable columns) and the root mean
 * square residual of that fit; `withSlopes` false keeps only the location
 * (a second start when the first fails).
 */
export function startingValues(
  distribution: Distribution,
  leastSquares: ArrayLike<number>,
  rootMeanSquare: number,
  design: StandardisedDesign,
  scaling: ResponseScaling,
  withSlopes = true,
): Float64Array {
  const gamma = toFitCoordinates(design, scaling, leastSquares);
  // Without slopes: the columns are centred, so the intercept alone is the fitted mean.
  if (!withSlopes) gamma.forEach((_, j) => { if (j !== design.intercept) gamma[j] = 0; });
  const p = gamma.length;
  const spread = rootMeanSquare / scaling.spread;
  const form = distribution.form;
  const shift = (by: number) => {
    if (design.intercept >= 0) gamma[design.intercept] -= by;
  };
  if (form.kind === 'gamma') {
    const shape = gammaShapeForLogVariance(spread * spread);
    shift(digamma(shape));
    return Float64Array.from([...gamma, Math.log(shape)]);
  }
  if (form.fixedScale) {
    shift(form.law.mean);
    return gamma;
  }
  const sigma = spread > 0 && Number.isFinite(spread) ? Math.min(1e3, Math.max(1e-3, spread / form.law.sd)) : 1;
  shift(form.law.mean * sigma);
  const theta = new Float64Array(p + 1);
  theta.set(gamma);
  theta[p] = Math.log(sigma);
  return theta;
}
