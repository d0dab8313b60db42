// Models fitted elsewhere, scored from their fitted means: the service
// computes the log-likelihood with every constant from the caller's means and
// the response, by the same function that scores the models fitted here, so
// a team's R, Python and SQL fits of the same counts get one number each.
// The means arrive aligned to the used rows (one per row; the caller maps
// data rows as it does residuals). The negative binomial needs θ, the gamma
// its shape and the inverse Gaussian its dispersion; the Gaussian takes
// σ² = RSS/n by maximum likelihood, as for residuals.
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import { FAMILIES } from './families.ts';
import { familyLogLikelihood } from './log-likelihood.ts';
import { checkGlmData, type GlmDataInput, type GlmFieldPaths } from './support.ts';
import type { DistributionParameterName, GlmFamilyName, Measure } from './types.ts';

export interface FittedMeansInput extends GlmDataInput {
  family: GlmFamilyName;
  /** The caller's fitted mean per used row: success probabilities for the binomial. */
  fitted: Float64Array;
  theta?: number;
  shape?: number;
  dispersion?: number;
  /** Where the candidate sits in the request, e.g. ['candidates', 3]. */
  at?: IssuePath;
  paths?: Partial<GlmFieldPaths>;
}

export interface FittedMeansScore {
  ok: true;
  logLikelihood: number | null;
  measure: Measure;
  observations: number;
  /** Σ prior × unit deviance at the caller's means (θ for the negative binomial). */
  deviance: number;
}

const MEAN_RANGE: Record<GlmFamilyName, { test: (mu: number) => boolean; words: string }> = {
  binomial: { test: (mu) => mu > 0 && mu < 1, words: 'a probability strictly between 0 and 1' },
  poisson: { test: (mu) => mu > 0 && Number.isFinite(mu), words: 'a positive number' },
  negativeBinomial: { test: (mu) => mu > 0 && Number.isFinite(mu), words: 'a positive number' },
  gamma: { test: (mu) => mu > 0 && Number.isFinite(mu), words: 'a positive number' },
  inverseGaussian: { test: (mu) => mu > 0 && Number.isFinite(mu), words: 'a positive number' },
  gaussian: { test: (mu) => Number.isFinite(mu), words: 'a finite number' },
};

const PARAMETER_OF: Partial<Record<GlmFamilyName, DistributionParameterName>> = {
  negativeBinomial: 'theta',
  gamma: 'shape',
  inverseGaussian: 'dispersion',
};

export function scoreFittedMeans(input: FittedMeansInput): FittedMeansScore | { issues: Issue[] } {
  const at = input.at ?? [];
  const paths: GlmFieldPaths = {
    candidate: at, response: ['response'], trials: ['trials'], offset: [...at, 'offset'], weights: ['weights'], ...input.paths,
  };
  const checked = checkGlmData(input.family, { ...input, offset: null }, paths);
  if ('issues' in checked) return checked;
  const { y, prior } = checked.rows;
  const n = y.length;
  const mu = input.fitted;
  if (mu.length !== n) return { issues: [issue('glm_fitted_count_mismatch', [...at, 'fitted'], { fitted: mu.length, rows: n, dataRows: n })] };
  const range = MEAN_RANGE[input.family];
  const bad = mu.findIndex((m) => !range.test(m));
  if (bad >= 0) {
    return {
      issues: [issue('glm_fitted_mean_invalid', [...at, 'fitted', bad], {
        family: input.family, row: input.rows ? input.rows[bad] : bad, value: mu[bad], support: range.words,
      })],
    };
  }
  const name = PARAMETER_OF[input.family];
  let parameter: number | null = null;
  if (name) {
    const value = input[name];
    if (!(typeof value === 'number' && value > 0 && Number.isFinite(value))) {
      return { issues: [issue('glm_distribution_parameter_invalid', [...at, name], { family: input.family, parameter: name, value: value ?? null })] };
    }
    parameter = value;
  }
  const family = FAMILIES[input.family];
  const weighted = input.family === 'binomial' || input.family === 'gaussian';
  let deviance = 0;
  for (let i = 0; i < n; i++) deviance += family.deviance(y[i], prior[i], mu[i], 1 - mu[i], parameter ?? Number.NaN);
  return {
    ok: true,
    logLikelihood: familyLogLikelihood(input.family, { y, prior: weighted ? prior : null, mu }, parameter),
    measure: family.measure,
    observations: n,
    deviance,
  };
}
