// The convention of generalised linear models in plain words, for the
// response's `conventions` and the README. Every sentence here is what the
// code does; change both together.
import { CONVERGENCE_RULE } from './irls.ts';

export const GLM_CONVENTIONS = {
  logLikelihood:
    'the full log-likelihood, every constant included: binomial Σ ln C(m, y) + y ln μ + (m − y) ln(1 − μ); Poisson Σ y ln μ − μ − ln y!; negative binomial Σ ln Γ(y + θ) − ln Γ(θ) − ln y! + θ ln(θ/(θ + μ)) + y ln(μ/(θ + μ)); gamma Σ ν ln(ν y/μ) − ν y/μ − ln y − ln Γ(ν) with shape ν; inverse Gaussian Σ −½ [ln(2π φ y³) + (y − μ)²/(φ μ² y)]; Gaussian the least-squares value −n/2 (ln 2π + ln(RSS/n) + 1) + ½ Σ ln w',
  parameterCount:
    'k = estimable coefficients (the rank of the design) plus one for θ (negative binomial), the shape (gamma) or the dispersion (inverse Gaussian, Gaussian σ²); binomial and Poisson estimate nothing else',
  observations: 'n = rows used; for a grouped binomial the rows (groups), not the trials',
  measure:
    'binomial, Poisson and negative binomial likelihoods are probability masses, Gaussian, gamma and inverse Gaussian ones densities; a mass and a density are never ranked together',
  distributionParameters:
    'by maximum likelihood at the fitted means: θ alternating with IRLS until both settle; the gamma shape from n (ln ν − ψ(ν)) = D/2; the inverse Gaussian dispersion D/n and the Gaussian σ² = RSS/n in closed form; standard errors from the information of that parameter with the means held fixed (expected for the shape and dispersions, observed for θ, as MASS reports it)',
  standardErrors:
    'from the expected (Fisher) information: φ (X\'WX)^-1 at the final IRLS weights, with φ = 1 (binomial, Poisson, negative binomial at its θ), 1/shape and the inverse Gaussian φ by maximum likelihood, and RSS/(n − rank) for the Gaussian (as least squares; R uses Pearson χ²/(n − rank) for gamma and inverse Gaussian instead, so its standard errors differ from these by that ratio); under a non-canonical link the observed information differs from the expected one by terms in y − μ, and tools that report the observed one give slightly different standard errors',
  gaussianIdentity: 'a Gaussian model with the identity link is least squares: the same solve, the same coefficients and standard errors bit for bit',
  convergence: CONVERGENCE_RULE,
  separation:
    'a binomial (logit, probit, cloglog) or count (log link) model whose likelihood keeps rising as some coefficients run to infinity is refused, naming those terms, once a direction along which no row\'s likelihood falls has been checked row by row; no huge finite estimate is reported',
  nullDeviance:
    'the deviance of the intercept-only model with the same offset, fitted (the offset-only model when the candidate has no intercept); devianceExplained = 1 − deviance/nullDeviance',
  fittedElsewhere:
    'fitted means (success probabilities for the binomial) are scored by the same log-likelihood, with the caller\'s θ, shape or dispersion where the family needs one; means must lie strictly inside the family\'s range',
  overdispersion:
    'Pearson χ²/(n − rank); QAIC = −2 ℓ/ĉ + 2k and QAICc = QAIC + 2k(k + 1)/(n − k − 1) with k counting ĉ',
} as const;
