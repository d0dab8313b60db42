// Log-likelihood contributions of the gamma distribution on the log-time
// scale y = ln t, with location μ = ln θ (θ the scale) and a = ln κ (κ the
// shape); u = e^{y - μ} = t/θ. With K(u) = κ ln u - u - lnΓ(κ), the log of
// u times the standard gamma density:
//   exact     K(u)                         (the density of ln t)
//   right     ln Q(κ, u)
//   left      ln P(κ, u)
//   interval  ln(P(κ, u_hi) - P(κ, u_lo))
// Derivatives in μ are closed form (∂u/∂μ = -u, ∂P/∂μ = -e^{K(u)}); those in κ
// of P and Q have none and come from incomplete-gamma.ts (term-by-term
// derivatives of the series and continued fraction). Derivatives in a = ln κ
// follow by the chain rule: ℓ_a = κ ℓ_κ, ℓ_aa = κ ℓ_κ + κ² ℓ_κκ, ℓ_μa = κ ℓ_μκ.
import digamma from '@stdlib/math-base-special-digamma';
import gammaln from '@stdlib/math-base-special-gammaln';
import trigamma from '@stdlib/math-base-special-trigamma';
import type { Bounds } from './bounds.ts';
import { EXACT, LEFT, RIGHT } from './censoring.ts';
import { incompleteGammaTails, type GammaTail } from './incomplete-gamma.ts';
import type { RowDerivatives } from './location-scale-likelihood.ts';
import { log1mexp, NeumaierSum } from './log-arithmetic.ts';

/**
 * ln D and D_κ/D, D_κκ/D for D = P(κ, uHi) - P(κ, uLo), taken as a difference
 * of upper tails when both ends lie in the upper tail, else of lower tails.
 */
export function gammaIntervalProbability(shape: number, uLo: number, uHi: number): { log: number; d1: number; d2: number } {
  const lo = incompleteGammaTails(shape, uLo);
  const hi = incompleteGammaTails(shape, uHi);
  let near: GammaTail;
  let far: GammaTail;
  if (lo.upper.log < hi.lower.log) {
    near = lo.upper;
    far = hi.upper;
  } else {
    near = hi.lower;
    far = lo.lower;
  }
  const log = near.log + log1mexp(far.log - near.log);
  const rNear = Math.exp(near.log - log);
  const rFar = Math.exp(far.log - log);
  return { log, d1: rNear * near.d1 - rFar * far.d1, d2: rNear * near.d2 - rFar * far.d2 };
}

export function gammaLogLikelihood(bounds: Bounds, mu: Float64Array, logShape: number, out: RowDerivatives | null): number {
  const shape = Math.exp(logShape);
  const lnGammaShape = gammaln(shape);
  const psi = digamma(shape);
  const psi1 = trigamma(shape);
  const kernel = (x: number, u: number) => shape * x - u - lnGammaShape;
  const total = new NeumaierSum();
  const { kind, lo, hi } = bounds;
  for (let i = 0; i < kind.length; i++) {
    const k = kind[i];
    if (k === EXACT) {
      const x = lo[i] - mu[i];
      const u = Math.exp(x);
      total.add(kernel(x, u));
      if (!out) continue;
      out.gMu[i] = u - shape;
      out.hMuMu[i] = -u;
      out.gS[i] = shape * (x - psi);
      out.hSS[i] = out.gS[i] - shape * shape * psi1;
      out.hMuS[i] = -shape;
      continue;
    }
    if (k === RIGHT || k === LEFT) {
      const x = (k === RIGHT ? lo[i] : hi[i]) - mu[i];
      const u = Math.exp(x);
      const tails = incompleteGammaTails(shape, u);
      const tail = k === RIGHT ? tails.upper : tails.lower;
      total.add(tail.log);
      if (!out) continue;
      // w = e^{K(u)} / Q for a right-censored unit; -e^{K(u)} / P for a left-censored one.
      const sign = k === RIGHT ? 1 : -1;
      const w = sign * Math.exp(kernel(x, u) - tail.log);
      out.gMu[i] = w;
      out.hMuMu[i] = w * (u - shape - w);
      out.gS[i] = shape * tail.d1;
      out.hSS[i] = shape * tail.d1 + shape * shape * (tail.d2 - tail.d1 * tail.d1);
      out.hMuS[i] = shape * w * (x - psi - tail.d1);
      continue;
    }
    const xLo = lo[i] - mu[i];
    const xHi = hi[i] - mu[i];
    const uLo = Math.exp(xLo);
    const uHi = Math.exp(xHi);
    const d = gammaIntervalProbability(shape, uLo, uHi);
    total.add(d.log);
    if (!out) continue;
    const mHi = Math.exp(kernel(xHi, uHi) - d.log);
    const mLo = Math.exp(kernel(xLo, uLo) - d.log);
    const dMu = -(mHi - mLo);
    const dMuMu = -(mHi * (uHi - shape) - mLo * (uLo - shape));
    const dMuK = -(mHi * (xHi - psi) - mLo * (xLo - psi));
    out.gMu[i] = dMu;
    out.hMuMu[i] = dMuMu - dMu * dMu;
    out.gS[i] = shape * d.d1;
    out.hSS[i] = shape * d.d1 + shape * shape * (d.d2 - d.d1 * d.d1);
    out.hMuS[i] = shape * (dMuK - dMu * d.d1);
  }
  return total.value();
}
