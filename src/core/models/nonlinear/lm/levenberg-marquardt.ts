// Levenberg–Marquardt with scaling and a trust region in the manner of Moré
// (1978), as in MINPACK's lmder: D = the largest Jacobian column norms seen so
// far, Δ0 = 100 ||D x0||, the step from lmParameter, and Moré's rules for
// accepting a step (ratio of actual to predicted reduction >= 1e-4) and for
// growing or shrinking Δ. Residuals are f_i = sqrt(w_i) (model_i - y_i).
//
// Bounds (an addition to Moré's method): at each new Jacobian a parameter
// sitting on a bound whose gradient points out of the box is held there
// (active); the step is computed over the free parameters and the trial
// point is projected onto the box. The predicted reduction of a projected
// step is computed from the same R, so the trust-region logic is unchanged.
//
// A trial point where the model is not finite counts as no reduction: Δ
// shrinks tenfold and the method tries a shorter step, which is how it steps
// around a domain edge (log of a negative number, a pole).
import { pivotedQR, type PivotedQR } from './pivoted-qr.ts';
import { lmParameter } from './lm-parameter.ts';

const EPS = 2 ** -52;

export interface LeastSquaresProblem {
  rows: number;
  parameters: number;
  /** Residuals at x into f; the first row whose residual is not finite, or -1. */
  residuals(x: Float64Array, f: Float64Array): number;
  /** Residuals and their Jacobian (column-major, n x p) at x; the first row with a non-finite value in either, or -1. */
  jacobian(x: Float64Array, f: Float64Array, jac: Float64Array): number;
}

export interface LmSettings {
  lower: Float64Array;
  upper: Float64Array;
  /** Most Jacobian evaluations (iterations). */
  maxIterations: number;
  /** Most residual evaluations, trial steps included. */
  maxEvaluations: number;
  /** Relative reduction of the sum of squares (actual and predicted) below which the fit stops. */
  ftol: number;
  /** Relative trust-region radius Δ / ||D x|| below which the fit stops. */
  xtol: number;
  /** Largest cosine between the residual vector and a free Jacobian column below which the fit stops. */
  gtol: number;
}

export type LmStop =
  | 'reduction' | 'step' | 'gradient' | 'rounding'
  | 'iterations' | 'evaluations' | 'non-finite';

export interface LmOutcome {
  x: Float64Array;
  /** Residuals at x. */
  f: Float64Array;
  sumOfSquares: number;
  iterations: number;
  evaluations: number;
  stop: LmStop;
  /** For a non-finite stop: the first row where the model or its derivatives had no finite value. */
  nonFiniteRow: number;
}

function norm(v: Float64Array): number {
  // Scaled to avoid overflow of the squares for residuals above 1e154.
  let scale = 0;
  for (let i = 0; i < v.length; i++) scale = Math.max(scale, Math.abs(v[i]));
  if (scale === 0 || !Number.isFinite(scale)) return scale;
  let s = 0;
  for (let i = 0; i < v.length; i++) s += (v[i] / scale) ** 2;
  return scale * Math.sqrt(s);
}

function scaledNorm(d: Float64Array, x: Float64Array): number {
  let s = 0;
  for (let j = 0; j < x.length; j++) s += (d[j] * x[j]) ** 2;
  return Math.sqrt(s);
}

export function levenbergMarquardt(problem: LeastSquaresProblem, x0: Float64Array, settings: LmSettings): LmOutcome {
  const n = problem.rows;
  const p = problem.parameters;
  const { lower, upper } = settings;
  let x = x0.slice();
  let f = new Float64Array(n);
  let trialF = new Float64Array(n);
  const jac = new Float64Array(n * p);
  const scratch = new Float64Array(n * p);
  const diag = new Float64Array(p);
  const colNorm = new Float64Array(p);
  let evaluations = 1;
  let iterations = 0;
  const outcome = (stop: LmStop, nonFiniteRow = -1): LmOutcome => {
    const s = norm(f);
    return { x, f, sumOfSquares: s * s, iterations, evaluations, stop, nonFiniteRow };
  };
  const startBad = problem.residuals(x, f);
  if (startBad >= 0) return outcome('non-finite', startBad);
  let fnorm = norm(f);
  let delta = 0;
  let xnorm = 0;
  let lambda = 0;

  for (;;) {
    if (iterations >= settings.maxIterations) return outcome('iterations');
    const jacBad = problem.jacobian(x, f, jac);
    iterations++;
    if (jacBad >= 0) return outcome('non-finite', jacBad);

    // Column norms and the gradient J'f decide scaling and the active set.
    const free: number[] = [];
    for (let j = 0; j < p; j++) {
      const off = j * n;
      let s = 0;
      let g = 0;
      for (let i = 0; i < n; i++) {
        s += jac[off + i] * jac[off + i];
        g += jac[off + i] * f[i];
      }
      colNorm[j] = Math.sqrt(s);
      const heldLow = x[j] <= lower[j] && g > 0;
      const heldHigh = x[j] >= upper[j] && g < 0;
      if (!heldLow && !heldHigh) free.push(j);
    }
    if (iterations === 1) {
      for (let j = 0; j < p; j++) diag[j] = colNorm[j] === 0 ? 1 : colNorm[j];
      xnorm = scaledNorm(diag, x);
      delta = xnorm === 0 ? 100 : 100 * xnorm;
    } else {
      for (let j = 0; j < p; j++) diag[j] = Math.max(diag[j], colNorm[j]);
    }
    const q = free.length;
    if (q === 0) return outcome('gradient'); // every parameter held at a bound by its gradient

    // The QR overwrites its input; the Jacobian is not needed again this iteration.
    let work = jac;
    if (q < p) {
      work = scratch;
      for (let c = 0; c < q; c++) work.copyWithin(c * n, free[c] * n, (free[c] + 1) * n);
    }
    const qr = pivotedQR(work, n, q, f);
    const freeDiag = new Float64Array(q);
    for (let c = 0; c < q; c++) freeDiag[c] = diag[free[c]];

    // Gradient test: the largest cosine between f and a free column of J.
    let gnorm = 0;
    if (fnorm !== 0) {
      for (let k = 0; k < q; k++) {
        const l = qr.pivot[k];
        const cn = colNorm[free[l]];
        if (cn === 0) continue;
        let s = 0;
        for (let i = 0; i <= k; i++) s += qr.r[i * q + k] * (qr.qtf[i] / fnorm);
        gnorm = Math.max(gnorm, Math.abs(s / cn));
      }
    }
    if (gnorm <= settings.gtol) return outcome('gradient');

    let lastNonFinite = -1;
    for (;;) {
      const lm = lmParameter(qr, freeDiag, delta, lambda);
      lambda = lm.lambda;
      const trial = x.slice();
      const taken = new Float64Array(q);
      let projected = false;
      for (let c = 0; c < q; c++) {
        const j = free[c];
        const v = x[j] + lm.step[c];
        const clipped = Math.min(Math.max(v, lower[j]), upper[j]);
        if (clipped !== v) projected = true;
        trial[j] = clipped;
        taken[c] = clipped - x[j];
      }
      const pnorm = scaledNorm(freeDiag, taken);
      if (iterations === 1) delta = Math.min(delta, pnorm);

      const bad = problem.residuals(trial, trialF);
      evaluations++;
      const fnorm1 = bad >= 0 ? Infinity : norm(trialF);
      const actred = 0.1 * fnorm1 < fnorm ? 1 - (fnorm1 / fnorm) ** 2 : -1;

      // Predicted reduction and directional derivative, relative to ||f||².
      let prered: number;
      let dirder: number;
      const rs = rTimesPermuted(qr, taken);
      const t1 = norm(rs) / fnorm;
      if (!projected) {
        const t2 = (Math.sqrt(lambda) * pnorm) / fnorm;
        prered = t1 * t1 + (t2 * t2) / 0.5;
        dirder = -(t1 * t1 + t2 * t2);
      } else {
        let cross = 0;
        for (let i = 0; i < q; i++) cross += (qr.qtf[i] / fnorm) * rs[i];
        prered = -2 * cross - t1 * t1;
        dirder = cross;
      }
      const ratio = prered !== 0 ? actred / prered : 0;

      if (ratio <= 0.25) {
        let temp = actred >= 0 ? 0.5 : (0.5 * dirder) / (dirder + 0.5 * actred);
        if (0.1 * fnorm1 >= fnorm || temp < 0.1) temp = 0.1;
        delta = temp * Math.min(delta, pnorm / 0.1);
        lambda /= temp;
      } else if (lambda === 0 || ratio >= 0.75) {
        delta = pnorm / 0.5;
        lambda *= 0.5;
      }

      if (ratio >= 1e-4) {
        x = trial;
        [f, trialF] = [trialF, f];
        fnorm = fnorm1;
        xnorm = scaledNorm(diag, x);
        lastNonFinite = -1;
      } else if (bad >= 0) {
        lastNonFinite = bad;
      }

      const stop = convergenceTest(actred, prered, ratio, delta, xnorm, gnorm, settings);
      // Δ collapsed while every recent trial met a non-finite value: stuck at a domain edge.
      if ((stop === 'step' || stop === 'rounding') && lastNonFinite >= 0) return outcome('non-finite', lastNonFinite);
      if (stop) return outcome(stop);
      if (evaluations >= settings.maxEvaluations) {
        return lastNonFinite >= 0 ? outcome('non-finite', lastNonFinite) : outcome('evaluations');
      }
      if (ratio >= 1e-4) break;
    }
  }
}

/** R P' s: the step in the QR's pivoted coordinates times R, for the predicted reduction. */
function rTimesPermuted(qr: PivotedQR, s: Float64Array): Float64Array {
  const q = qr.cols;
  const out = new Float64Array(q);
  for (let i = 0; i < q; i++) {
    let t = 0;
    for (let k = i; k < q; k++) t += qr.r[i * q + k] * s[qr.pivot[k]];
    out[i] = t;
  }
  return out;
}

/** Moré's stopping tests, then the ones that say rounding allows no further progress. */
function convergenceTest(
  actred: number, prered: number, ratio: number, delta: number, xnorm: number, gnorm: number, s: LmSettings,
): LmStop | null {
  if (Math.abs(actred) <= s.ftol && prered <= s.ftol && 0.5 * ratio <= 1) return 'reduction';
  if (delta <= s.xtol * xnorm) return 'step';
  if (Math.abs(actred) <= EPS && prered <= EPS && 0.5 * ratio <= 1) return 'rounding';
  if (delta <= EPS * xnorm || gnorm <= EPS) return 'rounding';
  return null;
}
