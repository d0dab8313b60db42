// The lifetime convention in plain words, for a response's `conventions`
// and the README. Bump LIFETIME_CONVENTIONS.version whenever a number could
// change meaning.
import { NEWTON_RULE } from './newton.ts';
import { TURNBULL_RULE } from './nonparametric/turnbull.ts';

export const LIFETIME_CONVENTIONS = {
  version: '1',
  logLikelihood:
    'on the time scale as sent, every constant included: ln f(t) for an exact failure, ln S(t) = ln P(T > t) for a right-censored unit, ln F(t) for a left-censored unit, ln(F(upper) - F(lower)) for an interval-censored unit; tails are computed in logs (log-survival through log1p and complementary functions, interval probabilities on the smaller side of the distribution) so that no contribution underflows',
  logTimeAlternative:
    'some tools report the likelihood of ln t instead; for the distributions of positive time (exponential, Weibull, lognormal, log-logistic, gamma) that value equals this one plus Σ ln t over the exact failures (censored units contribute probabilities, the same on both scales); it is given as logLikelihoodLogTime, and only likelihoods on one scale may be compared',
  parameterCount:
    'k = estimable location coefficients (the intercept and the columns of the terms, aliased columns left out) plus one for the scale σ (the shape κ for the gamma); the exponential has no such parameter (its log-time scale is fixed at 1)',
  location:
    'with terms the location depends on them: μ = x\'β is the location of ln t for the distributions of positive time and of t for normal, logistic and smallestExtremeValue (an accelerated-failure-time model); the gamma\'s location is the log of its scale',
  parameters:
    'exponential: scale (mean life) e^μ; Weibull: shape 1/σ, scale e^μ; lognormal: meanlog μ, sdlog σ; log-logistic: shape 1/σ, scale e^μ; gamma: shape κ, scale e^μ; normal: mean, sd; logistic and smallestExtremeValue: location, scale. Parameters that depend on the location are reported only for a model without terms',
  standardErrors:
    'from the observed information: the inverse of minus the analytic Hessian of the log-likelihood at the estimates, in the parameters (coefficients, ln σ or ln κ); the usual parameters by the delta method. The gamma\'s derivatives in its shape, which have no closed form for censored units, are the term-by-term derivatives of the incomplete gamma function\'s series and continued fraction',
  intervals:
    'Wald intervals at the interval level by the delta method: percentiles of the distributions of positive time on the log scale, of the others on the time scale; survival probabilities through the distribution\'s standardised deviate z = (y - μ)/σ, mapped back through S so they stay inside 0..1 — which is the log-log scale ln(-ln S) for the Weibull, exponential and smallestExtremeValue, the logit scale for the log-logistic and logistic, the probit scale for the lognormal and normal — and on the ln(-ln S) scale for the gamma. Likelihood-ratio intervals are not computed',
  valuesAtRows:
    'a model without terms reports percentiles (options.percentiles) and survival probabilities (options.survivalAt) once; a model with terms reports them, with its location and median life, at each options.predict row (lifePredictions), and its model-level lists are null with the caution life_values_depend_on_row. Life models have no mean response: predictions stays null and they are left out of averaged predictions',
  picture:
    'lifePicture holds what GET /v1/comparisons/{id}/life.svg draws, computed when the comparison ran (nothing is refitted to draw it): the nonparametric estimate of the fraction failed, thinned so it is never more than 0.002 from the full one, and each model\'s F(t) at 81 times; a model with terms as F(t | x) averaged over the comparison\'s rows',
  convergence: NEWTON_RULE,
  nonparametric: `Kaplan–Meier with Greenwood intervals on the log(-log S) scale for exact and right-censored data; Turnbull's estimate otherwise, by ${TURNBULL_RULE}`,
  nested:
    'likelihood-ratio tests between a model and a special case of it on the same observations: the same distribution with a subset of its terms, or the exponential inside the Weibull (shape 1) or the gamma (shape 1); LR = 2 (ℓ_larger - ℓ_smaller) against χ² with k_larger - k_smaller degrees of freedom; found automatically, and pairs named in options.tests that name a life model are tested this way (a named pair that is not nested is refused)',
  caution:
    'criteria rank candidate life models on these data; they do not show that any of them is adequate, and extrapolating a life model beyond the observed failures (low percentiles, other stresses) rests on the model, not the data. A life model chosen for a safety-relevant decision needs review by someone who knows the failure mechanism and the rules that apply locally',
} as const;
