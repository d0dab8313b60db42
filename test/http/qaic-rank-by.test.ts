// rankBy "qaic" and "qaicc" through POST /v1/comparisons: the verdict chooses
// by them, their weights and Δ follow from QAIC = −2 logL/ĉ + 2k with k
// counting ĉ (Burnham & Anderson 2002, §2.5), computed here by hand from R's
// log-likelihoods (test/reference/glm/glm-reference.json: R's glm, versions
// in the file); naming them without a ĉ is refused; a policy ranking by QAIC
// falls back to AIC/AICc without one; and the cautions about ĉ.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { referenceCase, relativeError } from '../core/models/glm/reference-data.ts';
import { activePolicy, PolicySchema } from '../../src/policy-file.ts';
import { DEFAULT_POLICY } from '../../src/core/scoring/policy.ts';

const straight = referenceCase('seams-poisson-offset');
const cubic = referenceCase('seams-poisson-cubic');
const n = straight.data.defects.length;

function payload(options: Record<string, unknown>, extra: Record<string, unknown> = {}) {
  return {
    data: { columns: straight.data }, response: straight.response,
    candidates: [
      { name: 'straight', terms: straight.terms, family: 'poisson', offset: 'logLength' },
      { name: 'cubic', terms: cubic.terms, family: 'poisson', offset: 'logLength' },
      { name: 'current-only', terms: ['current'], family: 'poisson', offset: 'logLength' },
    ],
    options,
    ...extra,
  };
}

type Model = { name: string; logLikelihood: number; parameters: number; qaic: number; qaicc: number };

t.test('rankBy qaic: the verdict chooses by QAIC; values and weights by hand from R\'s log-likelihoods', async (t) => {
  const { app } = await buildTestApp(t);
  const cHat = 1.8;
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat }, rankBy: 'qaic' }) });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const body = res.json();
  t.equal(body.verdict.rankBy, 'qaic');
  t.equal(body.conventions.rankBy, 'qaic');
  t.equal(body.conventions.rankByReason, 'named by the request');
  // QAIC by hand from R: k counts ĉ (R's k + 1).
  const qaic = (c: typeof straight) => (-2 * c.logLikelihood) / cHat + 2 * (c.parameters + 1);
  const byName = (name: string) => body.models.find((m: Model) => m.name === name) as Model;
  t.ok(relativeError(byName('straight').qaic, qaic(straight)) < 1e-10, 'straight: QAIC from R');
  t.ok(relativeError(byName('cubic').qaic, qaic(cubic)) < 1e-10, 'cubic: QAIC from R');
  const only = byName('current-only');
  const qaicOnly = (-2 * only.logLikelihood) / cHat + 2 * (only.parameters + 1);
  const values = { straight: qaic(straight), cubic: qaic(cubic), 'current-only': qaicOnly };
  const best = Object.entries(values).reduce((a, b) => (b[1] < a[1] ? b : a));
  t.equal(body.verdict.chosen, best[0], 'the smallest QAIC is chosen');
  t.equal(body.verdict.best.qaic, best[0]);
  // Akaike weights over QAIC: exp(−Δ/2) / Σ exp(−Δ/2) (Burnham & Anderson 2002).
  const sum = Object.values(values).reduce((s, v) => s + Math.exp(-(v - best[1]) / 2), 0);
  for (const e of body.rankings.qaic as { name: keyof typeof values; weight: number; delta: number }[]) {
    t.ok(Math.abs(e.delta - (values[e.name] - best[1])) < 1e-9, `Δ QAIC of ${e.name}`);
    t.ok(Math.abs(e.weight - Math.exp(-(values[e.name] - best[1]) / 2) / sum) < 1e-12, `weight of ${e.name}`);
  }
  t.ok(typeof body.verdict.best.qaicc === 'string', 'QAICc counted in the verdict');
  t.notOk(body.cautions.some((c: { code: string }) => c.code === 'overdispersion_not_ranked_by'), 'no caution: ranked by QAIC');

  const qaicc = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat }, rankBy: 'qaicc' }) });
  const k = straight.parameters + 1;
  t.equal(qaicc.json().verdict.rankBy, 'qaicc');
  t.ok(relativeError(qaicc.json().models[0].qaicc, qaic(straight) + (2 * k * (k + 1)) / (n - k - 1)) < 1e-10, 'QAICc from R');
  const top = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat } }, { rankBy: 'qaicc' }) });
  t.equal(top.json().verdict.rankBy, 'qaicc', 'top-level rankBy takes qaicc too');
});

t.test('agree counts QAIC: a ĉ that turns QAIC to the smaller model makes the criteria disagree; rankBy aicc is then cautioned', async (t) => {
  const { app } = await buildTestApp(t);
  const plain = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat: 1 } }) })).json();
  const [s, o] = ['straight', 'current-only'].map((name) => plain.models.find((m: Model) => m.name === name) as Model);
  // straight beats current-only on AIC when ℓs − ℓo > ks − ko; on QAIC only when (ℓs − ℓo)/ĉ > ks − ko.
  const gap = s.logLikelihood - o.logLikelihood;
  t.ok(gap > s.parameters - o.parameters, 'AIC prefers straight to current-only');
  t.equal(plain.verdict.best.aic, 'straight');
  const cHat = (2 * gap) / (s.parameters - o.parameters); // twice the ĉ at which QAIC ties
  const res = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat } }) })).json();
  t.equal(res.verdict.best.aic, 'straight');
  t.equal(res.verdict.best.qaic, 'current-only');
  t.equal(res.verdict.agree, false);
  t.equal(res.verdict.rankBy, 'aicc');
  t.match(res.verdict.summary, new RegExp(`QAIC 2ĉ = ${(2 * cHat).toFixed(2)}`));
  const caution = res.cautions.find((c: { code: string }) => c.code === 'overdispersion_not_ranked_by');
  t.ok(caution, 'ĉ > 1 while choosing by AICc is cautioned');
  t.match(caution.message, /chooses by AICc; QAIC or QAICc \(rankBy "qaic" or "qaicc"\) allow for ĉ/);
  t.notOk(res.cautions.some((c: { code: string }) => c.code === 'overdispersion_estimated'), 'a given ĉ is not an estimate');

  const estimated = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat: 'estimate' }, rankBy: 'qaic' }) })).json();
  t.equal(estimated.overdispersion.source, 'cubic', 'the candidate with the most parameters');
  t.match(estimated.cautions.find((c: { code: string }) => c.code === 'overdispersion_estimated').message, /estimated from candidate "cubic"/);
});

t.test('rankBy qaic or qaicc without options.overdispersion: 422 naming the field it was given in', async (t) => {
  const { app } = await buildTestApp(t);
  for (const [options, extra, path] of [
    [{ rankBy: 'qaic' }, {}, 'options/rankBy'],
    [{}, { rankBy: 'qaicc' }, 'rankBy'],
  ] as const) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload(options, extra) });
    t.equal(res.statusCode, 422, res.body.slice(0, 300));
    t.match(res.headers['content-type'], /application\/problem\+json/);
    const error = res.json().errors[0];
    t.equal(error.code, 'rank_by_needs_overdispersion');
    t.equal(error.path, path);
    t.match(error.message, /needs|divides the log-likelihood by an overdispersion factor ĉ/);
    t.match(error.message, /options\.overdispersion/);
  }
});

t.test('rankBy qaic with data.summary: refused the same way (a summary carries no counts to estimate ĉ from)', async (t) => {
  const { app } = await buildTestApp(t);
  const summary = { rows: 5, columns: ['x', 'y'], means: [3, -0.2], centredCrossProducts: [[10, 7.5], [7.5, 6.8]] };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { summary }, response: 'y', candidates: [{ name: 'line', terms: ['x'] }], options: { rankBy: 'qaic' } } });
  t.equal(res.statusCode, 422, res.body.slice(0, 300));
  t.same(res.json().errors.map((e: { code: string; path: string }) => [e.code, e.path]), [['rank_by_needs_overdispersion', 'options/rankBy']]);
});

t.test('a policy ranking by QAIC: QAIC with a ĉ, AIC (or AICc on a small sample) without one', async (t) => {
  const policy = activePolicy({ ...DEFAULT_POLICY, name: 'kiln-counts', rankBy: 'qaic', preferAiccBelowRatio: 10 }, 'test');
  const { app } = await buildTestApp(t, {}, { policy });
  const withCHat = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({ overdispersion: { cHat: 1.5 } }) })).json();
  t.equal(withCHat.verdict.rankBy, 'qaic', `n/k = ${n}/6 is not below 10`);
  t.equal(PolicySchema.safeParse({ name: 'kiln-counts', rankBy: 'qaicc' }).success, true, 'a policy file may name qaicc');
  const without = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: payload({}) })).json();
  t.equal(without.verdict.rankBy, 'aic');
  t.match(without.conventions.rankByReason, /policy "kiln-counts" ranks by QAIC, which needs ĉ/);
  t.equal(without.verdict.best.qaic, undefined, 'no QAIC in the verdict without a ĉ');
});
