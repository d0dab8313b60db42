// Predictions of a fitted model at new design rows: the linear predictor
// η = x'β + offset with its standard error √(φ x'(X'WX)^-1 x) on the link
// scale, a Wald interval there, and both carried to the mean by the inverse
// link (the interval's ends mapped, which keeps it inside the family's range;
// the standard error by the delta method, |dμ/dη| × SE(η)). The interval uses
// the t distribution on n - rank degrees of freedom for the Gaussian family
// (as least squares does), the standard normal otherwise (asymptotic). An end
// of the link-scale interval outside the link's domain or the family's range
// of means (an inverse link's η crossing 0) leaves that side of the mean's
// interval open: null.
//
// The new rows must come from the same design builder as the data (same
// labels and factor coding); estimability with aliased columns, and the
// quadratic form through an orthonormal basis, are the least-squares
// prediction's own (predict.ts), run on the model's working fit.
import normal from '@stdlib/stats-base-dists-normal';
import studentT from '@stdlib/stats-base-dists-t';
import type { DesignMatrix } from '../../types.ts';
import { predictMeanResponse } from '../../predict.ts';
import type { StatisticsIssue } from '../../inference/issue.ts';
import { LINKS } from './links.ts';
import { FAMILIES } from './families.ts';
import type { GlmFit } from './types.ts';

export interface ScaleEstimate {
  estimate: number;
  standardError: number | null;
  lower: number | null;
  upper: number | null;
}

/** Null throughout for a row the model cannot estimate (see predict.ts). */
export interface GlmPrediction {
  link: ScaleEstimate | null;
  mean: ScaleEstimate | null;
}

export interface GlmPredictionOptions {
  /** The offset at each new row (e.g. the log of its exposure); 0 without. */
  offset?: Float64Array;
  /** Interval level (default 0.95). */
  level?: number;
}

export function predictGlm(
  fit: GlmFit,
  design: DesignMatrix,
  rows: DesignMatrix,
  options: GlmPredictionOptions = {},
): { predictions: GlmPrediction[]; issues: StatisticsIssue[] } {
  const link = LINKS[fit.link];
  const family = FAMILIES[fit.family];
  const meanAt = (eta: number | null) => {
    if (eta === null || !link.validEta(eta)) return null;
    const mu = link.mean(eta);
    return family.validMean(mu, link.complement(eta)) ? mu : null;
  };
  const level = options.level ?? 0.95;
  const p = 1 - (1 - level) / 2;
  const quantile = fit.family === 'gaussian' ? studentT.quantile(p, fit.residualDf) : normal.quantile(p, 0, 1);
  const { predictions, issues } = predictMeanResponse(fit.working.fit, design, rows, fit.working.weights);
  const out = predictions.map((pr, i): GlmPrediction => {
    if (pr.estimate === null) return { link: null, mean: null };
    const eta = pr.estimate + (options.offset ? options.offset[i] : 0);
    const se = pr.standardError;
    const width = se === null || !Number.isFinite(quantile) ? null : quantile * se;
    const lowerEta = width === null ? null : eta - width;
    const upperEta = width === null ? null : eta + width;
    // A decreasing link (inverse, inverseSquare) maps the lower η to the upper mean.
    const increasing = link.derivative(eta) > 0;
    const ends = increasing ? [meanAt(lowerEta), meanAt(upperEta)] : [meanAt(upperEta), meanAt(lowerEta)];
    return {
      link: { estimate: eta, standardError: se, lower: lowerEta, upper: upperEta },
      mean: {
        estimate: link.mean(eta),
        standardError: se === null ? null : Math.abs(link.derivative(eta)) * se,
        lower: ends[0],
        upper: ends[1],
      },
    };
  });
  return { predictions: out, issues };
}
