// The link functions g(μ) = η of the contract, each with its inverse, the
// complement 1 - μ and the derivative dμ/dη, evaluated so that the tails keep
// their digits: a binomial fit near 0 or 1 needs 1 - μ directly (not by
// subtraction) for its variance, deviance and log-likelihood, and IRLS needs
// dμ/dη where μ itself has rounded to 1.
import erfc from '@stdlib/math-base-special-erfc';
import erfcinv from '@stdlib/math-base-special-erfcinv';
import expm1 from '@stdlib/math-base-special-expm1';
import log1p from '@stdlib/math-base-special-log1p';
import type { GlmLinkName } from './types.ts';

export interface Link {
  name: GlmLinkName;
  /** η = g(μ). */
  link(mu: number): number;
  /** μ = g⁻¹(η). */
  mean(eta: number): number;
  /** 1 - μ, formed without cancellation where it matters (the binomial links). */
  complement(eta: number): number;
  /** dμ/dη. */
  derivative(eta: number): number;
  /** Whether g⁻¹ is defined at η (the family adds its own range of μ). */
  validEta(eta: number): boolean;
}

const SQRT2 = Math.SQRT2;
const INV_SQRT_2PI = 0.3989422804014327; // 1/√(2π)

const finite = (eta: number) => Number.isFinite(eta);
const positive = (eta: number) => eta > 0 && Number.isFinite(eta);

export const LINKS: Record<GlmLinkName, Link> = {
  identity: {
    name: 'identity',
    link: (mu) => mu,
    mean: (eta) => eta,
    complement: (eta) => 1 - eta,
    derivative: () => 1,
    validEta: finite,
  },
  log: {
    name: 'log',
    link: (mu) => Math.log(mu),
    mean: (eta) => Math.exp(eta),
    complement: (eta) => -expm1(eta),
    derivative: (eta) => Math.exp(eta),
    validEta: finite,
  },
  logit: {
    name: 'logit',
    link: (mu) => Math.log(mu / (1 - mu)),
    // 1/(1 + e^-η) and e^-|η|/(1 + e^-|η|): the smaller of μ and 1 - μ is never a difference.
    mean: (eta) => (eta >= 0 ? 1 / (1 + Math.exp(-eta)) : Math.exp(eta) / (1 + Math.exp(eta))),
    complement: (eta) => (eta >= 0 ? Math.exp(-eta) / (1 + Math.exp(-eta)) : 1 / (1 + Math.exp(eta))),
    derivative: (eta) => {
      const e = Math.exp(-Math.abs(eta));
      return e / ((1 + e) * (1 + e));
    },
    validEta: finite,
  },
  probit: {
    name: 'probit',
    link: (mu) => -SQRT2 * erfcinv(2 * mu),
    mean: (eta) => 0.5 * erfc(-eta / SQRT2),
    complement: (eta) => 0.5 * erfc(eta / SQRT2),
    derivative: (eta) => INV_SQRT_2PI * Math.exp(-0.5 * eta * eta),
    validEta: finite,
  },
  cloglog: {
    name: 'cloglog',
    link: (mu) => Math.log(-log1p(-mu)),
    mean: (eta) => -expm1(-Math.exp(eta)),
    complement: (eta) => Math.exp(-Math.exp(eta)),
    derivative: (eta) => Math.exp(eta - Math.exp(eta)),
    validEta: finite,
  },
  inverse: {
    name: 'inverse',
    link: (mu) => 1 / mu,
    mean: (eta) => 1 / eta,
    complement: (eta) => 1 - 1 / eta,
    derivative: (eta) => -1 / (eta * eta),
    validEta: (eta) => eta !== 0 && Number.isFinite(eta),
  },
  // The square-root link is taken on η > 0, as R's poisson(link = "sqrt") does:
  // μ = η² would otherwise give two η for one μ.
  sqrt: {
    name: 'sqrt',
    link: (mu) => Math.sqrt(mu),
    mean: (eta) => eta * eta,
    complement: (eta) => 1 - eta * eta,
    derivative: (eta) => 2 * eta,
    validEta: positive,
  },
  inverseSquare: {
    name: 'inverseSquare',
    link: (mu) => 1 / (mu * mu),
    mean: (eta) => 1 / Math.sqrt(eta),
    complement: (eta) => 1 - 1 / Math.sqrt(eta),
    derivative: (eta) => -0.5 / (eta * Math.sqrt(eta)),
    validEta: positive,
  },
};
