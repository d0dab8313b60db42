// The ball-bearing fatigue data of Lieblein & Zelen (1956): 23 uncensored
// endurances (millions of revolutions), fitted by every distribution. The
// references (test/reference/lifetime/, versions named there): scipy 1.10
// for the estimates (score equations solved to 1e-15), the log-likelihood
// (sum of scipy.stats logpdf) and percentiles (ppf); R survival::survreg for
// the standard errors of the seven families it has; the gamma's observed
// information in closed form.
//
// The NIST/SEMATECH e-Handbook's censored Weibull example (a published
// censored set) is checked through HTTP in test/http/lifetime-handbook.test.ts.
import t from 'tap';
import { fitLifetime, uncensoredResponse, DISTRIBUTION_NAMES, type LifetimeFit } from '../../../../src/core/models/lifetime/index.ts';
import { bearings, design, readReference, relativeError } from './fixtures.ts';

const scipy = readReference('bearings-scipy.json');
const survreg = readReference('survreg-aft.json').bearings;
const times = bearings();
const rows = times.map((_, i) => i);
const X = design({ t: times }, [], rows);
const data = uncensoredResponse(Float64Array.from(times), rows, 't');

function fit(distribution: string): LifetimeFit {
  const f = fitLifetime({ name: distribution, distribution, design: X }, data, { percentiles: [0.01, 0.1, 0.5, 0.9] });
  if ('issues' in f) throw new Error(JSON.stringify(f.issues));
  return f;
}

for (const distribution of DISTRIBUTION_NAMES) {
  t.test(`${distribution}: estimates, log-likelihood and percentiles equal scipy`, async (t) => {
    const ref = scipy.fits[distribution];
    const f = fit(distribution);
    t.ok(relativeError(f.logLikelihood, ref.logLikelihood) < 1e-12, `logLik ${f.logLikelihood} vs ${ref.logLikelihood}`);
    for (const p of f.distributionParameters) {
      t.ok(relativeError(p.estimate, ref[p.name]) < 1e-9, `${p.name} ${p.estimate} vs ${ref[p.name]}`);
    }
    t.same(f.distributionParameters.map((p) => p.name).sort(), Object.keys(ref).filter((k) => !['logLikelihood', 'percentiles', 'shapeStandardError', 'scaleStandardError'].includes(k)).sort());
    for (const q of f.percentiles!) {
      t.ok(relativeError(q.estimate, ref.percentiles[String(q.probability)]) < 1e-9, `t_${q.probability} ${q.estimate} vs ${ref.percentiles[String(q.probability)]}`);
      t.ok(q.lower! < q.estimate && q.estimate < q.upper!, 'the interval holds the estimate');
    }
    t.equal(f.parameters, distribution === 'exponential' ? 1 : 2);
    t.equal(f.observations, 23);
    t.same(f.censoring, { exact: 23, right: 0, left: 0, interval: 0 });
  });
}

for (const distribution of DISTRIBUTION_NAMES) {
  if (distribution === 'gamma') continue;
  t.test(`${distribution}: standard errors equal survreg's`, async (t) => {
    const ref = survreg[distribution];
    const f = fit(distribution);
    t.ok(relativeError(f.coefficients[0].standardError!, ref.standardErrors[0]) < 1e-7, `se(intercept) ${f.coefficients[0].standardError} vs ${ref.standardErrors[0]}`);
    if (distribution !== 'exponential') {
      const se = Math.sqrt(f.covariance.matrix[1][1]);
      t.ok(relativeError(se, ref.standardErrors[1]) < 1e-7, `se(log σ) ${se} vs ${ref.standardErrors[1]}`);
    }
  });
}

t.test('gamma: standard errors equal the closed-form observed information', async (t) => {
  const ref = scipy.fits.gamma;
  const f = fit('gamma');
  const [shape, scale] = f.distributionParameters;
  t.ok(relativeError(shape.standardError!, ref.shapeStandardError) < 1e-9, `se(shape) ${shape.standardError} vs ${ref.shapeStandardError}`);
  t.ok(relativeError(scale.standardError!, ref.scaleStandardError) < 1e-9, `se(scale) ${scale.standardError} vs ${ref.scaleStandardError}`);
});

t.test('survival at a percentile is one minus its probability', async (t) => {
  for (const distribution of DISTRIBUTION_NAMES) {
    const f = fitLifetime({ name: distribution, distribution, design: X }, data, { percentiles: [0.1, 0.5], survivalAt: [] });
    if ('issues' in f) throw new Error('fit');
    const at = f.percentiles!.map((q) => q.estimate);
    const g = fitLifetime({ name: distribution, distribution, design: X }, data, { survivalAt: at });
    if ('issues' in g) throw new Error('fit');
    g.survival!.forEach((s, k) => {
      t.ok(Math.abs(s.estimate - (1 - f.percentiles![k].probability)) < 1e-12, `${distribution}: S(t_p) = 1 - p`);
      t.ok(s.lower! <= s.estimate && s.estimate <= s.upper!, `${distribution}: the interval holds the estimate`);
    });
  }
});
