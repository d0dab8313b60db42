// Maximum-likelihood estimates of the parameter a family estimates besides
// its coefficients, each with its standard error. In the gamma, inverse
// Gaussian and Gaussian families the coefficients do not depend on the
// dispersion, so the joint maximum is IRLS first, then the dispersion's own
// likelihood equation at the fitted means; the expected information is block
// diagonal between coefficients and dispersion (so is the negative
// binomial's between β and θ), which is why each standard error below is
// computed with the means held fixed.
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';

/**
 * ln ν - ψ(ν), accurate for large ν where the two nearly cancel: the
 * asymptotic series 1/(2ν) + Σ B_2k / (2k ν^2k) (Abramowitz & Stegun 6.3.18),
 * terms to ν^-14, whose truncation error at ν >= 10 is below 1e-16 relative.
 */
export function logMinusDigamma(nu: number): number {
  if (nu < 10) return Math.log(nu) - digamma(nu);
  const v = 1 / (nu * nu);
  // B2/2, B4/4, …, B14/14 with alternating signs folded in.
  const series = v * (1 / 12 - v * (1 / 120 - v * (1 / 252 - v * (1 / 240 - v * (1 / 132 - v * (691 / 32760 - v / 12))))));
  return 0.5 / nu + series;
}

/** ψ'(ν) - 1/ν, by the series 1/(2ν²) + Σ B_2k / ν^(2k+1) (A&S 6.4.12) at ν >= 10. */
export function trigammaMinusReciprocal(nu: number): number {
  if (nu < 10) return trigamma(nu) - 1 / nu;
  const v = 1 / (nu * nu);
  const series = (v / nu) * (1 / 6 - v * (1 / 30 - v * (1 / 42 - v * (1 / 30 - v * (5 / 66 - v * (691 / 2730 - v * 7 / 6))))));
  return 0.5 * v + series;
}

export interface ParameterEstimate {
  estimate: number;
  standardError: number;
}

/**
 * The gamma shape ν by maximum likelihood at fitted means: the score
 * equation n (ln ν - ψ(ν)) = D/2 with D the deviance (no closed form), solved
 * by Newton's method on ln ν from Minka's (2002) closed-form approximation.
 * Standard error from the Fisher information n (ψ'(ν) - 1/ν). Null when
 * D = 0 (an exact fit: the likelihood grows without bound in ν).
 */
export function gammaShape(deviance: number, n: number): ParameterEstimate | null {
  const s = deviance / (2 * n);
  if (!(s > 0) || !Number.isFinite(s)) return null;
  let nu = (3 - s + Math.sqrt((s - 3) * (s - 3) + 24 * s)) / (12 * s);
  for (let k = 0; k < 100; k++) {
    // f(u) = ln ν - ψ(ν) - s with u = ln ν; df/du = 1 - ν ψ'(ν) = -ν (ψ'(ν) - 1/ν).
    const f = logMinusDigamma(nu) - s;
    const slope = -nu * trigammaMinusReciprocal(nu);
    const du = Math.max(-2, Math.min(2, -f / slope));
    nu *= Math.exp(du);
    if (Math.abs(du) < 1e-15) break;
  }
  return { estimate: nu, standardError: 1 / Math.sqrt(n * trigammaMinusReciprocal(nu)) };
}

/**
 * A dispersion φ with closed-form maximum likelihood φ = D/n (inverse
 * Gaussian: D its deviance; Gaussian: D = Σ w e², σ² by ML), standard error
 * φ √(2/n) from the Fisher information n / (2 φ²).
 */
export function closedFormDispersion(deviance: number, n: number): ParameterEstimate | null {
  const phi = deviance / n;
  if (!(phi > 0) || !Number.isFinite(phi)) return null;
  return { estimate: phi, standardError: phi * Math.sqrt(2 / n) };
}
