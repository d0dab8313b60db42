// Models fitted elsewhere, scored from their fitted means: the same numbers
// as the models fitted here (to 1e-10), the same as R's log-likelihoods, and
// clear issues for means or parameters a family cannot take.
import t from 'tap';
import { scoreFittedMeans } from '../../../../src/core/models/glm/index.ts';
import { FITTED_CASES, fitCase, referenceCase, relativeError } from './reference-data.ts';

t.test('scoring a fitted model\'s own means reproduces its log-likelihood', async (t) => {
  for (const name of FITTED_CASES) {
    const c = referenceCase(name);
    const { fit } = fitCase(c);
    const parameter = fit.distributionParameters[0];
    const score = scoreFittedMeans({
      family: c.family,
      response: Float64Array.from(c.data[c.response] as number[]),
      trials: c.trials ? Float64Array.from(c.data[c.trials] as number[]) : undefined,
      fitted: Float64Array.from(fit.fitted),
      theta: parameter?.name === 'theta' ? parameter.estimate : undefined,
      shape: parameter?.name === 'shape' ? parameter.estimate : undefined,
      dispersion: parameter?.name === 'dispersion' && c.family !== 'gaussian' ? parameter.estimate : undefined,
    });
    if ('issues' in score) throw new Error(score.issues[0].message);
    t.ok(relativeError(score.logLikelihood, fit.logLikelihood!) < 1e-10, `${name}: ${score.logLikelihood} vs ${fit.logLikelihood}`);
    t.ok(relativeError(score.logLikelihood, c.logLikelihood) < 1e-12, `${name}: against R`);
    t.ok(relativeError(score.deviance, fit.deviance) < 1e-10, `${name}: deviance`);
    t.equal(score.measure, fit.measure);
    t.equal(score.observations, fit.observations);
  }
});

t.test('issues: means outside the family\'s range, missing parameters, wrong counts', async (t) => {
  const y = Float64Array.from([0, 1, 1, 0]);
  let out = scoreFittedMeans({ family: 'binomial', response: y, fitted: Float64Array.from([0.2, 1.2, 0.5, 0.4]), at: ['candidates', 3] });
  t.equal('issues' in out ? out.issues[0].code : null, 'glm_fitted_mean_invalid');
  t.match('issues' in out ? out.issues[0].message : '', /^candidates\/3\/fitted\/1 is 1.2 at row 1; a binomial fitted mean must be a probability strictly between 0 and 1/);
  out = scoreFittedMeans({ family: 'poisson', response: Float64Array.from([0, 2, 1]), fitted: Float64Array.from([0, 2, 1]) });
  t.equal('issues' in out ? out.issues[0].code : null, 'glm_fitted_mean_invalid', 'a Poisson mean of 0');
  out = scoreFittedMeans({ family: 'poisson', response: Float64Array.from([0, 2, 1]), fitted: Float64Array.from([1, 2]), at: ['candidates', 1] });
  t.equal('issues' in out ? out.issues[0].code : null, 'glm_fitted_count_mismatch');
  for (const [family, name] of [['negativeBinomial', 'theta'], ['gamma', 'shape'], ['inverseGaussian', 'dispersion']] as const) {
    out = scoreFittedMeans({ family, response: Float64Array.from([1, 2, 3]), fitted: Float64Array.from([1, 2, 3]), at: ['candidates', 2] });
    t.equal('issues' in out ? out.issues[0].code : null, 'glm_distribution_parameter_invalid', `${family} without ${name}`);
    t.same('issues' in out ? out.issues[0].path : null, ['candidates', 2, name]);
    out = scoreFittedMeans({ family, response: Float64Array.from([1, 2, 3]), fitted: Float64Array.from([1, 2, 3]), [name]: -1 });
    t.match('issues' in out ? out.issues[0].message : '', /positive finite number, not -1/);
  }
  out = scoreFittedMeans({ family: 'gamma', response: Float64Array.from([1, 0, 3]), fitted: Float64Array.from([1, 2, 3]), shape: 2 });
  t.equal('issues' in out ? out.issues[0].code : null, 'glm_response_outside_support', 'the response is checked as for a fit');
});

t.test('hand-computed log-likelihoods (definitions; common practice)', async (t) => {
  // Poisson: y ln μ - μ - ln y!, rows (2, μ=1.5) and (0, μ=0.4).
  let out = scoreFittedMeans({ family: 'poisson', response: Float64Array.from([2, 0]), fitted: Float64Array.from([1.5, 0.4]) });
  const poisson = 2 * Math.log(1.5) - 1.5 - Math.log(2) - 0.4;
  t.ok(relativeError('issues' in out ? null : out.logLikelihood, poisson) < 1e-15);
  // Binomial with trials: ln C(5, 2) + 2 ln 0.3 + 3 ln 0.7.
  out = scoreFittedMeans({ family: 'binomial', response: Float64Array.from([2]), trials: Float64Array.from([5]), fitted: Float64Array.from([0.3]) });
  t.ok(relativeError('issues' in out ? null : out.logLikelihood, Math.log(10) + 2 * Math.log(0.3) + 3 * Math.log(0.7)) < 1e-15);
  // Negative binomial, y = 3, μ = 2, θ = 1.5: Γ(4.5)/(Γ(1.5) 3!) (1.5/3.5)^1.5 (2/3.5)^3,
  // with Γ(4.5)/Γ(1.5) = 3.5 × 2.5 × 1.5.
  out = scoreFittedMeans({ family: 'negativeBinomial', response: Float64Array.from([3]), fitted: Float64Array.from([2]), theta: 1.5 });
  const nb = Math.log(3.5 * 2.5 * 1.5 / 6) + 1.5 * Math.log(1.5 / 3.5) + 3 * Math.log(2 / 3.5);
  t.ok(relativeError('issues' in out ? null : out.logLikelihood, nb) < 1e-14);
  // Gamma, shape 2, y = 3, μ = 2: rate 1: 2 ln 1 + ln 3 - 3 - ln Γ(2) = ln 3 - 3.
  out = scoreFittedMeans({ family: 'gamma', response: Float64Array.from([3]), fitted: Float64Array.from([2]), shape: 2 });
  t.ok(relativeError('issues' in out ? null : out.logLikelihood, Math.log(3) - 3) < 1e-14);
  // Inverse Gaussian, φ = 0.5, y = 2, μ = 1: -½ [ln(2π 0.5 8) + 1/(0.5 × 2)] = -½ (ln 8π + 1).
  out = scoreFittedMeans({ family: 'inverseGaussian', response: Float64Array.from([2]), fitted: Float64Array.from([1]), dispersion: 0.5 });
  t.ok(relativeError('issues' in out ? null : out.logLikelihood, -0.5 * (Math.log(8 * Math.PI) + 1)) < 1e-14);
});
