// Accelerated-failure-time fits against R's survival::survreg (seven
// families) and scipy.optimize on the censored gamma likelihood, on the
// seeded solder-joint life test of test/reference/lifetime (made by
// scripts/lifetime-reference.py and .R; versions in the JSON files):
// cycles ~ 1/kelvin + finish + load, once with right, left and interval
// censoring and once with exact and right-censored cycles only.
// Tolerances: survreg stops at a relative log-likelihood change of 1e-13, so
// its log-likelihood is at the maximum to rounding (compared to 1e-10
// relative) while its estimates are within ~1e-7 of it (compared to 1e-6
// relative); scipy's BFGS stops at gtol 1e-9 (estimates to 1e-5).
import t from 'tap';
import { fitLifetime, DISTRIBUTION_NAMES, type LifetimeFit } from '../../../../src/core/models/lifetime/index.ts';
import { design, readReference, relativeError, response, solderJoints, SOLDER_TERMS } from './fixtures.ts';

const survreg = readReference('survreg-aft.json');
const gamma = readReference('gamma-aft-scipy.json');
const columns = solderJoints();
const X = design(columns, SOLDER_TERMS);
const data = {
  mixed: response(columns, 'cycles', { status: 'status', upper: 'upper' }),
  right: response(columns, 'rightOnlyCycles', { status: 'rightOnlyStatus' }),
};

function fit(distribution: string, set: keyof typeof data): LifetimeFit {
  const f = fitLifetime({ name: `${distribution}-${set}`, distribution, design: X }, data[set]);
  if ('issues' in f) throw new Error(JSON.stringify(f.issues));
  return f;
}

t.test('design labels follow the survreg formula', async (t) => {
  t.same(X.labels, survreg.terms);
});

for (const set of ['mixed', 'right'] as const) {
  for (const distribution of DISTRIBUTION_NAMES) {
    if (distribution === 'gamma') continue;
    t.test(`${distribution}, ${set} censoring: equals survreg`, async (t) => {
      const ref = survreg[set][distribution];
      const f = fit(distribution, set);
      t.ok(relativeError(f.logLikelihood, ref.logLikelihood) < 1e-10, `logLik ${f.logLikelihood} vs survreg ${ref.logLikelihood}`);
      f.coefficients.forEach((c, k) => {
        t.ok(relativeError(c.estimate!, ref.coefficients[k]) < 1e-6, `${c.term} ${c.estimate} vs ${ref.coefficients[k]}`);
        t.ok(relativeError(c.standardError!, ref.standardErrors[k]) < 1e-6, `se(${c.term}) ${c.standardError} vs ${ref.standardErrors[k]}`);
      });
      const sigma = f.estimates.extra === null ? 1 : Math.exp(f.estimates.extra);
      t.ok(relativeError(sigma, ref.scale) < 1e-6, `scale ${sigma} vs ${ref.scale}`);
      // survreg's vcov covers (coefficients, Log(scale)): the same parameterisation as ours.
      const m = f.covariance.matrix.length;
      t.equal(m, ref.covariance.length);
      for (let i = 0; i < m; i++) {
        for (let j = 0; j < m; j++) {
          const want = ref.covariance[i][j];
          const scale = Math.sqrt(ref.covariance[i][i] * ref.covariance[j][j]);
          t.ok(Math.abs(f.covariance.matrix[i][j] - want) <= 1e-6 * scale, `cov[${i}][${j}]`);
        }
      }
      t.equal(f.parameters, 4 + (distribution === 'exponential' ? 0 : 1), 'k counts the coefficients and the scale');
      t.equal(f.observations, 90);
    });
  }
  t.test(`gamma, ${set} censoring: equals scipy.optimize on the censored gamma likelihood`, async (t) => {
    const ref = gamma.fits[set];
    const f = fit('gamma', set);
    // Our value is at least scipy's (we stop at a tighter rule); both are the maximum to ~1e-9.
    t.ok(f.logLikelihood >= ref.logLikelihood - 1e-9 && f.logLikelihood - ref.logLikelihood < 1e-8, `logLik ${f.logLikelihood} vs ${ref.logLikelihood}`);
    f.coefficients.forEach((c, k) => t.ok(relativeError(c.estimate!, ref.coefficients[k]) < 1e-5, `${c.term} ${c.estimate} vs ${ref.coefficients[k]}`));
    t.ok(relativeError(f.distributionParameters[0].estimate, ref.shape) < 1e-5, 'shape');
    t.equal(f.distributionParameters.length, 1, 'with terms only the shape is a distribution parameter');
    t.equal(f.parameters, 5);
  });
}

t.test('Weibull AFT: the log-time likelihood plus Σ ln t over failures is the time-scale likelihood (survreg\'s)', async (t) => {
  for (const set of ['mixed', 'right'] as const) {
    const f = fit('weibull', set);
    const r = data[set];
    let sumLog = 0;
    r.status.forEach((s, i) => { if (s === 0) sumLog += Math.log(r.time[i]); });
    // The log-time likelihood summed directly: smallest-extreme-value densities of ln t over σ
    // for failures, survival / distribution / interval probabilities for the others.
    const sigma = Math.exp(f.estimates.extra!);
    let direct = 0;
    r.status.forEach((s, i) => {
      const mu = f.fittedLocation[i];
      const z = (v: number) => (Math.log(v) - mu) / sigma;
      const F = (v: number) => -Math.expm1(-Math.exp(z(v)));
      if (s === 0) direct += z(r.time[i]) - Math.exp(z(r.time[i])) - Math.log(sigma);
      else if (s === 1) direct += -Math.exp(z(r.time[i]));
      else if (s === 2) direct += Math.log(F(r.time[i]));
      else direct += Math.log(F(r.upper[i]) - F(r.time[i]));
    });
    t.ok(relativeError(f.logLikelihoodLogTime!, direct) < 1e-12, `log-time ${f.logLikelihoodLogTime} vs direct ${direct}`);
    t.ok(relativeError(direct - sumLog, survreg[set].weibull.logLikelihood) < 1e-10, 'log-time - Σ ln t = survreg');
    t.ok(relativeError(f.logLikelihoodLogTime! - sumLog, f.logLikelihood) < 1e-14);
  }
});
