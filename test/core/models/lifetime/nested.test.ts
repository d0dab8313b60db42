// Likelihood-ratio tests between lifetime candidates, found by a pure
// function: the exponential inside the Weibull and the gamma, and covariate
// subsets of one distribution. The statistic is checked against survreg's
// log-likelihoods (test/reference/lifetime/survreg-aft.json); the χ² tail
// against a closed form.
import t from 'tap';
import { fitLifetime, lifetimeNestedTests, nestingCandidateOf, type LifetimeNestingCandidate } from '../../../../src/core/models/lifetime/index.ts';
import type { Term } from '../../../../src/core/types.ts';
import { design, readReference, relativeError, response, solderJoints, SOLDER_TERMS } from './fixtures.ts';

const columns = solderJoints();
const data = response(columns, 'rightOnlyCycles', { status: 'rightOnlyStatus' });

function candidate(name: string, distribution: string, terms: Term[]): LifetimeNestingCandidate {
  const X = design(columns, terms);
  const f = fitLifetime({ name, distribution, design: X }, data);
  if ('issues' in f) throw new Error(JSON.stringify(f.issues));
  return nestingCandidateOf(f, X, 'solder');
}

const all = [
  candidate('exp-aft', 'exponential', SOLDER_TERMS),
  candidate('weibull-aft', 'weibull', SOLDER_TERMS),
  candidate('gamma-aft', 'gamma', SOLDER_TERMS),
  candidate('weibull', 'weibull', []),
  candidate('weibull-kelvin', 'weibull', [SOLDER_TERMS[0]]),
  candidate('lognormal-aft', 'lognormal', SOLDER_TERMS),
];

t.test('detected pairs: exponential in Weibull and gamma, covariate subsets; nothing else', async (t) => {
  const { tests, issues } = lifetimeNestedTests(all);
  t.same(issues, []);
  const found = tests.map((x) => `${x.smaller} < ${x.larger} (df ${x.df})`).sort();
  t.same(found, [
    'exp-aft < gamma-aft (df 1)',
    'exp-aft < weibull-aft (df 1)',
    'weibull < weibull-aft (df 3)',
    'weibull < weibull-kelvin (df 1)',
    'weibull-kelvin < weibull-aft (df 2)',
  ]);
});

t.test('the statistic is twice the log-likelihood gain (survreg\'s values) and its χ² tail', async (t) => {
  const ref = readReference('survreg-aft.json').right;
  const { tests } = lifetimeNestedTests(all);
  const expWeibull = tests.find((x) => x.smaller === 'exp-aft' && x.larger === 'weibull-aft')!;
  const want = 2 * (ref.weibull.logLikelihood - ref.exponential.logLikelihood);
  t.ok(relativeError(expWeibull.lrStatistic, want) < 1e-9, `LR ${expWeibull.lrStatistic} vs survreg ${want}`);
  // χ²(1) upper tail = erfc(sqrt(x/2)) (closed form); at these LR values it is tiny, compared in logs.
  t.ok(expWeibull.pValue > 0 && expWeibull.pValue < 1e-6);
  t.match(expWeibull.restriction, /Weibull shape fixed at 1/);
  const subset = tests.find((x) => x.smaller === 'weibull-kelvin')!;
  t.match(subset.restriction, /2 location columns set to 0/);
});

t.test('requested pairs: a pair that is not nested, or an unknown name, is an issue', async (t) => {
  const { issues } = lifetimeNestedTests(all, [
    { smaller: 'lognormal-aft', larger: 'weibull-aft' },
    { smaller: 'ghost', larger: 'weibull-aft' },
    { smaller: 'exp-aft', larger: 'weibull-aft' },
  ]);
  t.same(issues.map((i) => i.code), ['nested-test-not-nested', 'nested-test-unknown-candidate']);
  const other = all.map((c) => (c.name === 'weibull' ? { ...c, sample: 'another' } : c));
  t.notOk(lifetimeNestedTests(other).tests.some((x) => x.smaller === 'weibull'), 'different observations are never nested');
});
