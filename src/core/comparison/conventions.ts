// What every response says it did, in words a reviewer can check against the
// README. Bump CONVENTIONS_VERSION whenever any number could change meaning.
import type { CriterionName } from '../criteria.ts';
import { ALIAS_TOLERANCE } from '../fit/index.ts';

export const CONVENTIONS_VERSION = '1';

export interface Conventions {
  version: string;
  parameterCount: string;
  logLikelihood: string;
  weights: string;
  r2: string;
  commonRows: string;
  rank: string;
  rankBy: CriterionName;
  confidenceLevel: number;
}

export function conventions(rankBy: CriterionName, confidenceLevel: number): Conventions {
  return {
    version: CONVENTIONS_VERSION,
    parameterCount: 'k = estimable coefficients (numerical rank of the design) plus one for the error variance',
    logLikelihood: 'full Gaussian maximum-likelihood value, constants included: -n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w',
    weights: 'relative weights w: RSS = Σ w e², and ½ Σ ln w is added to the log-likelihood',
    r2: 'R² = 1 - RSS/TSS with TSS about the (weighted) mean; uncentred (about 0) for a model without intercept',
    commonRows: 'a row with a missing value in any column any candidate uses is dropped for every candidate',
    rank: `a design column is aliased when the part of it not explained by the columns before it, after centring and scaling, is below ${ALIAS_TOLERANCE} of its norm`,
    rankBy,
    confidenceLevel,
  };
}
