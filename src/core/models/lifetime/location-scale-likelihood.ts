// Log-likelihood contributions of a location-scale law on the scale y, with
// z = (y - μ)/σ and σ = e^s:
//   exact     ln f0(z) - s
//   right     ln S0(z)
//   left      ln F0(z)
//   interval  ln(F0(z_hi) - F0(z_lo))
// and their analytic first and second derivatives in (μ, s). For the first
// three, with g the log-function of z (ln f0, ln S0, ln F0) and ∂z/∂μ = -1/σ,
// ∂z/∂s = -z:
//   ℓ_μ = -g'/σ,  ℓ_s = -z g' (- 1 for exact),  ℓ_μμ = g''/σ²,
//   ℓ_μs = (z g'' + g')/σ,  ℓ_ss = z g' + z² g''.
// For an interval, with D = F0(z_hi) - F0(z_lo), a_e = f0(z_e)/D, h_e = (ln f0)'(z_e)
// and Σ± meaning (hi term) - (lo term):
//   A = Σ± a,  B = Σ± z a,  C = Σ± a h,  E = Σ± z a h,  G = Σ± z² a h;
//   ℓ_μ = -A/σ, ℓ_s = -B, ℓ_μμ = (C - A²)/σ², ℓ_μs = (E + A - AB)/σ, ℓ_ss = B + G - B².
// D itself is formed on whichever side of the law is smaller (survival
// functions when both ends are in the upper tail), in logs, so that neither
// tail cancels: ln D = ln X_near + ln(1 - X_far/X_near).
import type { StandardLaw } from './standard-families.ts';
import type { Bounds } from './bounds.ts';
import { EXACT, LEFT, RIGHT } from './censoring.ts';
import { log1mexp, NeumaierSum } from './log-arithmetic.ts';

/** Per-row first and second derivatives of the contributions in (μ, s). */
export interface RowDerivatives {
  gMu: Float64Array;
  gS: Float64Array;
  hMuMu: Float64Array;
  hMuS: Float64Array;
  hSS: Float64Array;
}

export function rowDerivatives(n: number): RowDerivatives {
  return {
    gMu: new Float64Array(n), gS: new Float64Array(n), hMuMu: new Float64Array(n), hMuS: new Float64Array(n), hSS: new Float64Array(n),
  };
}

/** ln(F0(zHi) - F0(zLo)) for zLo < zHi, on the smaller side of the law. */
export function logIntervalProbability(law: StandardLaw, zLo: number, zHi: number): number {
  const logSLo = law.logSurvival(zLo);
  const logFHi = law.logDistribution(zHi);
  if (logSLo < logFHi) return logSLo + log1mexp(law.logSurvival(zHi) - logSLo);
  return logFHi + log1mexp(law.logDistribution(zLo) - logFHi);
}

/**
 * Σ ℓ_i at location mu[i] and log scale s; with `out`, each row's
 * derivatives are written there.
 */
export function locationScaleLogLikelihood(
  law: StandardLaw,
  bounds: Bounds,
  mu: Float64Array,
  s: number,
  out: RowDerivatives | null,
): number {
  const invSigma = Math.exp(-s);
  const total = new NeumaierSum();
  const { kind, lo, hi } = bounds;
  for (let i = 0; i < kind.length; i++) {
    const k = kind[i];
    if (k === EXACT || k === RIGHT || k === LEFT) {
      const z = ((k === LEFT ? hi[i] : lo[i]) - mu[i]) * invSigma;
      let value: number;
      let g1 = 0;
      let g2 = 0;
      if (k === EXACT) {
        value = law.logDensity(z) - s;
        if (out) { g1 = law.score(z); g2 = law.scoreSlope(z); }
      } else if (k === RIGHT) {
        value = law.logSurvival(z);
        if (out) { g1 = law.survivalSlope(z); g2 = law.survivalCurvature(z); }
      } else {
        value = law.logDistribution(z);
        if (out) { g1 = law.distributionSlope(z); g2 = law.distributionCurvature(z); }
      }
      total.add(value);
      if (!out) continue;
      out.gMu[i] = -g1 * invSigma;
      out.gS[i] = -z * g1 - (k === EXACT ? 1 : 0);
      out.hMuMu[i] = g2 * invSigma * invSigma;
      out.hMuS[i] = (z * g2 + g1) * invSigma;
      out.hSS[i] = z * g1 + z * z * g2;
      continue;
    }
    const zLo = (lo[i] - mu[i]) * invSigma;
    const zHi = (hi[i] - mu[i]) * invSigma;
    const logD = logIntervalProbability(law, zLo, zHi);
    total.add(logD);
    if (!out) continue;
    const aHi = Math.exp(law.logDensity(zHi) - logD);
    const aLo = Math.exp(law.logDensity(zLo) - logD);
    const hHi = law.score(zHi);
    const hLo = law.score(zLo);
    const A = aHi - aLo;
    const B = zHi * aHi - zLo * aLo;
    const C = aHi * hHi - aLo * hLo;
    const E = zHi * aHi * hHi - zLo * aLo * hLo;
    const G = zHi * zHi * aHi * hHi - zLo * zLo * aLo * hLo;
    out.gMu[i] = -A * invSigma;
    out.gS[i] = -B;
    out.hMuMu[i] = (C - A * A) * invSigma * invSigma;
    out.hMuS[i] = (E + A - A * B) * invSigma;
    out.hSS[i] = B + G - B * B;
  }
  return total.value();
}
