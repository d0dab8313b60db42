// Predictions of a model fitted from a data summary. The summary holds all
// a prediction needs: the coefficients, and the inverse cross products of the
// estimable predictors, so var(μ̂) = σ̂² (1/W + (x − x̄)'M(x − x̄)) with an
// intercept (σ̂² x'Mx without) — the same numbers a fit on the rows gives, to
// the accuracy of the normal equations. A row is predicted only when every
// predictor is estimable: with an aliased predictor the fit's choice of zero
// for its coefficient would decide the answer.
import { responseScale } from '../inference/back-transform.ts';
import type { ScaledPrediction } from '../inference/prediction-intervals.ts';
import { newObservationError } from '../inference/prediction-intervals.ts';
import type { SummaryFit } from './fit.ts';

export function predictFromSummary(
  fit: SummaryFit,
  predictors: readonly string[],
  intercept: boolean,
  rows: Readonly<Record<string, ReadonlyArray<number | string | null>>>,
  count: number,
): ScaledPrediction[] {
  const { estimable, inverse, means, weightSum } = fit.predictionFactor;
  const df = fit.observations - fit.rank;
  const scale = responseScale(null);
  const offset = intercept ? 1 : 0;
  const out: ScaledPrediction[] = [];
  for (let r = 0; r < count; r++) {
    const x = predictors.map((name) => rows[name][r] as number);
    if (estimable.length !== predictors.length) {
      out.push({ location: null, standardError: null, newObservationError: null, df, scale });
      continue;
    }
    let location = intercept ? (fit.coefficients[0] as number) : 0;
    predictors.forEach((_, k) => { location += (fit.coefficients[k + offset] as number) * x[k]; });
    const centred = estimable.map((k) => (intercept ? x[k] - means[k] : x[k]));
    let factor = intercept ? 1 / weightSum : 0;
    for (let a = 0; a < centred.length; a++) for (let b = 0; b < centred.length; b++) factor += centred[a] * inverse[a][b] * centred[b];
    const standardError = fit.sigma === null ? null : fit.sigma * Math.sqrt(Math.max(factor, 0));
    out.push({ location, standardError, newObservationError: newObservationError(fit.sigma, standardError, 1), df, scale });
  }
  return out;
}
