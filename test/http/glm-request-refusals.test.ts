// Small refusals of GLM and life requests, each naming its field in plain
// words: a trials column no candidate reads (422), and a family, link,
// offset or distribution of the wrong type (400 at the field, not the
// generic list of candidate forms). A binomial beside a Poisson of the same
// counts is a fair comparison (both probability masses of the same numbers);
// the Poisson's likelihood does not involve trials, which a caution says.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { referenceCase, relativeError } from '../core/models/glm/reference-data.ts';

const beetles = referenceCase('beetle-logit');
const seams = referenceCase('seams-poisson-offset');

t.test('trials with no binomial candidate: 422 naming trials and every candidate', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: seams.data }, response: seams.response, trials: 'length',
      candidates: [{ name: 'per-length', terms: seams.terms, family: 'poisson', offset: 'logLength' }, { name: 'straight-line', terms: ['current'] }],
    },
  });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  t.match(res.headers['content-type'], /application\/problem\+json/);
  const [error, ...rest] = res.json().errors;
  t.equal(rest.length, 0, 'said once');
  t.equal(error.code, 'trials_without_binomial');
  t.equal(error.path, 'trials');
  t.match(error.message, /trials are read only by binomial candidates/);
  t.match(error.message, /"per-length" \(poisson\), "straight-line" \(least squares\)/);
});

t.test('trials with a binomial candidate beside a Poisson: both ranked, the Poisson cautioned', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: beetles.data }, response: beetles.response, trials: beetles.trials,
      candidates: [{ name: 'logit', terms: beetles.terms, family: 'binomial' }, { name: 'counts', terms: beetles.terms, family: 'poisson' }],
    },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  // The binomial reads the trials: its log-likelihood is R's (test/reference/glm, R's glm).
  t.ok(relativeError(body.models[0].logLikelihood, beetles.logLikelihood) < 1e-9, 'binomial with trials as R');
  const caution = body.cautions.find((c: { code: string }) => c.code === 'trials_not_read');
  t.ok(caution);
  t.equal(caution.message, `The trials column "${beetles.trials}" is read by the binomial candidates only; "counts" (poisson) models the response as it is, without trials.`);
  const alone = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: { data: { columns: beetles.data }, response: beetles.response, trials: beetles.trials, candidates: [{ name: 'logit', terms: beetles.terms, family: 'binomial' }] },
  });
  t.notOk(alone.json().cautions.some((c: { code: string }) => c.code === 'trials_not_read'), 'no caution when every candidate reads trials');
});

t.test('a wrong-typed family, link, offset or distribution is named at its field', async (t) => {
  const { app } = await buildTestApp(t);
  const cases: [Record<string, unknown>, string, RegExp][] = [
    [{ name: 'm', terms: ['current'], family: 7 }, 'candidates/0/family', /^family must be one of "gaussian", "binomial", "poisson", "negativeBinomial", "gamma", "inverseGaussian"$/],
    [{ name: 'm', terms: ['current'], family: 'poisson', link: 'logt' }, 'candidates/0/link', /^link must be one of "identity", "log", "logit"/],
    [{ name: 'm', terms: ['current'], family: 'poisson', offset: 2 }, 'candidates/0/offset', /^offset names a numeric column of data\.columns \(its name as a string/],
    [{ name: 'm', distribution: 3 }, 'candidates/0/distribution', /^distribution must be one of "exponential", "weibull", "lognormal"/],
    [{ name: 'm', distribution: 'weibul' }, 'candidates/0/distribution', /^distribution must be one of "exponential", "weibull"/],
    [{ name: 'm', family: 7, fitted: [1, 2], parameters: 2 }, 'candidates/0/family', /^family must be one of/],
  ];
  for (const [candidate, path, message] of cases) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: seams.data }, response: seams.response, candidates: [candidate] } });
    t.equal(res.statusCode, 400, JSON.stringify(candidate));
    t.match(res.headers['content-type'], /application\/problem\+json/);
    const errors = res.json().errors as { path: string; message: string }[];
    t.same(errors.map((e) => e.path), [path], `${JSON.stringify(candidate)}: one error at ${path}`);
    t.match(errors[0].message, message);
  }
  // Still the list of forms when the candidate resembles none (no key of any form).
  const none = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: seams.data }, response: seams.response, candidates: [{ name: 'm', kiln: 'west' }] } });
  t.match(none.json().errors[0], { path: 'candidates/0', message: /^a candidate is one of: \{ name, terms/ });
});
