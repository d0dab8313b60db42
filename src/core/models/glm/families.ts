// The exponential families of the contract: range of the mean, variance
// function, unit deviance, starting means and the links each admits.
//
// Rows carry the response as sent (y: successes for the binomial) and a prior
// weight (trials m for the binomial, the relative weight for the Gaussian, 1
// otherwise). The binomial mean μ is the success probability, so its response
// on the mean scale is y/m; every other family's is y.
//
// Admitted links follow R's families (stats::binomial, poisson, Gamma,
// inverse.gaussian, gaussian; MASS::negative.binomial), restricted to the
// contract's links: a pair outside the table is an issue, not a fit. The
// binomial identity link is left out as R leaves it out: it lets μ leave
// [0, 1] and the likelihood is then undefined.
import log1p from '@stdlib/math-base-special-log1p';
import type { DistributionParameterName, GlmFamilyName, GlmLinkName, Measure } from './types.ts';

export interface Family {
  name: GlmFamilyName;
  measure: Measure;
  canonical: GlmLinkName;
  links: readonly GlmLinkName[];
  /** The parameter estimated besides the coefficients (counted in k), or null. */
  parameter: DistributionParameterName | null;
  /** Whether μ (with 1 - μ) lies in the family's range of means. */
  validMean(mu: number, complement: number): boolean;
  /** V(μ); θ is read by the negative binomial only. */
  variance(mu: number, complement: number, theta: number): number;
  /** y on the mean scale minus μ, without cancellation at the binomial's ends. */
  residual(y: number, prior: number, mu: number, complement: number): number;
  /** prior × unit deviance of one row. */
  deviance(y: number, prior: number, mu: number, complement: number, theta: number): number;
  /** Starting mean (R's mustart). */
  start(y: number, prior: number): number;
}

/** a ln(a/b), 0 at a = 0 (the limit); the ratio first, logs apart only if it leaves the doubles. */
export function xLogXOver(a: number, b: number): number {
  if (a === 0) return 0;
  const ratio = a / b;
  return a * (ratio > 0 && Number.isFinite(ratio) ? Math.log(ratio) : Math.log(a) - Math.log(b));
}

const positiveMean = (mu: number) => mu > 0 && Number.isFinite(mu);

const BINOMIAL: Family = {
  name: 'binomial',
  measure: 'mass',
  canonical: 'logit',
  links: ['logit', 'probit', 'cloglog', 'log'],
  parameter: null,
  validMean: (mu, c) => mu > 0 && c > 0 && Number.isFinite(mu),
  variance: (mu, c) => mu * c,
  residual: (y, m, mu, c) => (y === m ? c : y === 0 ? -mu : y / m - mu),
  deviance: (y, m, mu, c) => 2 * (xLogXOver(y, m * mu) + xLogXOver(m - y, m * c)),
  start: (y, m) => (y + 0.5) / (m + 1),
};

const POISSON: Family = {
  name: 'poisson',
  measure: 'mass',
  canonical: 'log',
  links: ['log', 'identity', 'sqrt'],
  parameter: null,
  validMean: positiveMean,
  variance: (mu) => mu,
  residual: (y, _m, mu) => y - mu,
  deviance: (y, _m, mu) => 2 * (xLogXOver(y, mu) - (y - mu)),
  start: (y) => y + 0.1,
};

// The negative binomial shares the Poisson's support, links and residual.
const NEGATIVE_BINOMIAL: Family = {
  ...POISSON,
  name: 'negativeBinomial',
  parameter: 'theta',
  // NB2: variance μ + μ²/θ (θ → ∞ is the Poisson).
  variance: (mu, _c, theta) => mu + (mu * mu) / theta,
  deviance: (y, _m, mu, _c, theta) => 2 * (xLogXOver(y, mu) - (y + theta) * log1p((y - mu) / (mu + theta))),
  start: (y) => (y === 0 ? 1 / 6 : y),
};

const GAMMA: Family = {
  name: 'gamma',
  measure: 'density',
  canonical: 'inverse',
  links: ['inverse', 'log', 'identity'],
  parameter: 'shape',
  validMean: positiveMean,
  variance: (mu) => mu * mu,
  residual: (y, _m, mu) => y - mu,
  // 2 (-ln(y/μ) + (y - μ)/μ) = 2 (t - ln(1 + t)) with t = (y - μ)/μ.
  deviance: (y, _m, mu) => {
    const t = (y - mu) / mu;
    return 2 * (t - log1p(t));
  },
  start: (y) => y,
};

// The inverse Gaussian shares the gamma's support, residual and start.
const INVERSE_GAUSSIAN: Family = {
  ...GAMMA,
  name: 'inverseGaussian',
  canonical: 'inverseSquare',
  links: ['inverseSquare', 'inverse', 'log', 'identity'],
  parameter: 'dispersion',
  variance: (mu) => mu * mu * mu,
  deviance: (y, _m, mu) => ((y - mu) * (y - mu)) / (mu * mu * y),
};

const GAUSSIAN: Family = {
  name: 'gaussian',
  measure: 'density',
  canonical: 'identity',
  links: ['identity', 'log', 'inverse'],
  parameter: 'dispersion',
  validMean: (mu) => Number.isFinite(mu),
  variance: () => 1,
  residual: (y, _m, mu) => y - mu,
  deviance: (y, w, mu) => w * (y - mu) * (y - mu),
  start: (y) => y,
};

export const FAMILIES: Record<GlmFamilyName, Family> = {
  gaussian: GAUSSIAN,
  binomial: BINOMIAL,
  poisson: POISSON,
  negativeBinomial: NEGATIVE_BINOMIAL,
  gamma: GAMMA,
  inverseGaussian: INVERSE_GAUSSIAN,
};

/** The family's canonical link when none is given; null when the pair is not admitted. */
export function resolveLink(family: GlmFamilyName, link: GlmLinkName | undefined): GlmLinkName | null {
  const f = FAMILIES[family];
  const chosen = link ?? f.canonical;
  return f.links.includes(chosen) ? chosen : null;
}
