// What every response says it did, in words a reviewer can check against the
// README. Bump CONVENTIONS_VERSION whenever any number could change meaning.
import type { CriterionName } from '../criteria.ts';
import type { RankByChoice } from '../policy.ts';
import { ALIAS_TOLERANCE } from '../fit/index.ts';
import { PIVOT_TOLERANCE } from '../search/sweep.ts';

export const CONVENTIONS_VERSION = '1';

export interface Conventions {
  version: string;
  parameterCount: string;
  logLikelihood: string;
  weights: string;
  r2: string;
  commonRows: string;
  rank: string;
  fittedElsewhere: string;
  responseTransforms: string;
  rankBy: CriterionName;
  rankByReason: string;
  confidenceLevel: number;
}

/** The rank rule of a fit by QR on the rows (src/core/fit). */
export const ROWS_RANK_RULE = `a design column is aliased when the part of it not explained by the columns before it, after centring and scaling, is below ${ALIAS_TOLERANCE} of its norm`;

/**
 * The rank rule of a sweep of cross products (fits from a data summary, the
 * subset search's screening). The normal equations carry rounding of about
 * eps times the squared condition number, so the rows' rule (a squared-norm
 * ratio of 1e-20) is below their noise; the sweep's own threshold is stated.
 */
export const SWEEP_RANK_RULE = `a design column is aliased when its sum of squares not explained by the columns before it (centred with an intercept) is below ${PIVOT_TOLERANCE} of its own sum of squares — a remaining-norm ratio of ${Math.sqrt(PIVOT_TOLERANCE).toExponential()}, coarser than the ${ALIAS_TOLERANCE} of a fit on the rows, because normal equations lose digits to the squared condition number`;

export function conventions(choice: RankByChoice, confidenceLevel: number, rank: string = ROWS_RANK_RULE): Conventions {
  return {
    version: CONVENTIONS_VERSION,
    parameterCount: 'k = estimable coefficients (numerical rank of the design) plus one for the error variance; for a model fitted elsewhere, k as the caller states it',
    logLikelihood: 'full Gaussian maximum-likelihood value, constants included: -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w (+ the Jacobian of a response transform)',
    weights: 'relative weights w: RSS = Σ w e², and ½ Σ ln w is added to the log-likelihood',
    r2: 'R² = 1 - RSS/TSS with TSS about the (weighted) mean; uncentred (about 0) for a model without intercept; for a model fitted elsewhere, centred with p = k - 1 coefficients',
    commonRows: 'a row with a missing value in any column any candidate uses is dropped for every candidate',
    rank,
    fittedElsewhere: 'residuals and RSS become the Gaussian log-likelihood above; a stated logLikelihood is used as given (constants are the caller\'s responsibility); observation counts must equal the rows used',
    responseTransforms: 'a model of g(y) gains Σ ln g\'(y): log -Σ ln y, sqrt -Σ ln(2√y), Box–Cox (λ-1) Σ ln y, so its likelihood is on the scale of y',
    rankBy: choice.rankBy,
    rankByReason: choice.reason,
    confidenceLevel,
  };
}
