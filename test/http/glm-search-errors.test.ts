// What a generalised-linear search refuses, and how: the family's checks with
// the words a comparison candidate gets (a link the family does not admit,
// trials without a binomial family, responses outside the support, a data
// summary, a response transform), the price at the door, and subsets whose
// fit separates skipped and counted while the search goes on.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { seededUniform } from '../../scripts/seeded-random.ts';

/** Firing batches of the tile scenario (invented): crack counts out of tiles tested. */
function batches(rows = 30) {
  const u = seededUniform(11);
  const peakTemp: number[] = [];
  const moisture: number[] = [];
  const glaze: number[] = [];
  const tested: number[] = [];
  const cracked: number[] = [];
  for (let i = 0; i < rows; i++) {
    peakTemp.push(1150 + Math.round(100 * u()));
    moisture.push(4 + Math.round(40 * u()) / 10);
    glaze.push(200 + Math.round(200 * u()));
    tested.push(20 + Math.floor(30 * u()));
    cracked.push(Math.floor(tested[i] * (0.1 + 0.3 * u())));
  }
  return { peakTemp, moisture, glaze, tested, cracked };
}

const base = () => ({ data: { columns: batches() }, response: 'cracked', pool: ['peakTemp', 'moisture', 'glaze'], family: 'binomial', trials: 'tested' });

t.test('refusals name the field, as a comparison candidate\'s do', async (t) => {
  const { app } = await buildTestApp(t);
  const post = (payload: object) => app.inject({ method: 'POST', url: '/v1/searches', payload });
  const errors = (res: { json: () => { errors: { code: string; path: string }[] } }) => res.json().errors.map((e) => [e.code, e.path]);

  const link = await post({ ...base(), link: 'inverseSquare' });
  t.equal(link.statusCode, 422);
  t.same(errors(link), [['glm_link_not_allowed', 'link']], 'a link the family does not admit');

  const { trials: _trials, ...untrialled } = base();
  const noBinomial = await post({ ...untrialled, family: 'poisson', trials: 'tested' });
  t.equal(noBinomial.statusCode, 422);
  t.same(errors(noBinomial), [['trials_without_binomial', 'trials']], 'trials without a binomial family, as a comparison refuses them');
  t.match(noBinomial.json().errors[0].message, /family "poisson"/);
  const leastSquares = await post({ ...untrialled, family: undefined, trials: 'tested' });
  t.same(errors(leastSquares), [['trials_without_binomial', 'trials']], 'and with least squares');

  const above = base();
  above.data.columns.cracked[4] = 99;
  const over = await post(above);
  t.equal(over.statusCode, 422);
  t.same(errors(over), [['glm_successes_above_trials', 'response']], 'successes above their trials');

  const counts = { ...untrialled, family: 'poisson', data: { columns: { ...batches(), cracked: batches().cracked.map((c, i) => (i === 2 ? 2.5 : c)) } } };
  const notCount = await post(counts);
  t.equal(notCount.statusCode, 422);
  t.same(errors(notCount), [['glm_count_not_integer', 'response']], 'a count family needs whole counts');

  const binary = await post({ ...untrialled });
  t.equal(binary.statusCode, 422, 'a binomial without trials needs 0/1');
  t.equal(binary.json().errors[0].code, 'glm_response_outside_support');

  const offset = await post({ ...base(), offset: 'exposure' });
  t.equal(offset.statusCode, 422);
  t.same(errors(offset), [['unknown_column', 'offset']], 'an unknown offset column');
  const trialsColumn = await post({ ...base(), trials: 'batchSize' });
  t.same(errors(trialsColumn), [['unknown_column', 'trials']], 'an unknown trials column');

  const transformed = await post({ ...base(), responseTransform: { fn: 'log' } });
  t.equal(transformed.statusCode, 400);
  t.equal(transformed.json().errors[0].path, 'responseTransform');

  const weighted = await post({ ...base(), weights: 'glaze' });
  t.equal(weighted.statusCode, 422);
  t.same(errors(weighted), [['glm_weights_not_supported', 'weights']]);

});

t.test('a subset that separates is skipped and counted; the search goes on', async (t) => {
  const { app } = await buildTestApp(t);
  const u = seededUniform(5);
  const rows = 40;
  const peakTemp = Array.from({ length: rows }, () => 1150 + Math.round(100 * u()));
  const moisture = Array.from({ length: rows }, () => 4 + Math.round(40 * u()) / 10);
  // A glaze reading that splits the cracked tiles from the sound ones exactly.
  const cracked = Array.from({ length: rows }, (_, i) => (i % 3 === 0 ? 1 : 0));
  const glazeGap = cracked.map((c, i) => (c === 1 ? 10 + (i % 5) : -10 - (i % 7)));
  const res = await app.inject({
    method: 'POST', url: '/v1/searches',
    payload: { data: { columns: { cracked, peakTemp, moisture, glazeGap } }, response: 'cracked', pool: ['peakTemp', 'moisture', 'glazeGap'], family: 'binomial', top: 8 },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  t.equal(body.glm.fitFailures.separation, 4, 'the four subsets holding glazeGap separate');
  t.equal(body.passedOver.fitFailed, 4);
  t.equal(body.evaluated, 4, 'the other four are scored');
  t.equal(body.models.length, 4);
  t.ok(body.models.every((m: { terms: string[] }) => !m.terms.includes('glazeGap')), 'none of the listed models holds the separating term');
  const skipped = body.cautions.find((c: { code: string }) => c.code === 'glm_subsets_skipped');
  t.ok(skipped, 'a caution says so');
  t.match(skipped.message, /4 separated/);
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'selection_optimism'), 'and the usual cautions stand');
});

t.test('priced by fits at the door', async (t) => {
  // 3000 batches: each IRLS fit costs far more than a sweep of cross products.
  const { app: small } = await buildTestApp(t, { maxRequestWork: 20_000_000 });
  const many = { ...base(), data: { columns: batches(3000) } };
  const refused = await small.inject({ method: 'POST', url: '/v1/searches', payload: many });
  t.equal(refused.statusCode, 422, 'over the work cap');
  t.equal(refused.json().errors[0].code, 'work_limit');
  t.match(refused.json().errors[0].largest, /IRLS/, 'the largest part named is the fitting');
  const leastSquares = await small.inject({ method: 'POST', url: '/v1/searches', payload: { data: many.data, response: 'cracked', pool: many.pool } });
  t.equal(leastSquares.statusCode, 200, 'the same pool by least squares fits in that cap');

  const { app } = await buildTestApp(t);
  const pool = Array.from({ length: 17 }, (_, k) => `r${k}`);
  const columns: Record<string, number[]> = { ...batches() };
  const u = seededUniform(3);
  for (const name of pool) columns[name] = columns.peakTemp.map(() => u());
  const exhaustive = await app.inject({ method: 'POST', url: '/v1/searches', payload: { ...base(), data: { columns }, pool, exhaustive: true } });
  t.equal(exhaustive.statusCode, 422);
  t.equal(exhaustive.json().errors[0].code, 'search_over_budget', 'every subset of 17 terms is beyond the GLM limit');
  const heuristic = await app.inject({ method: 'POST', url: '/v1/searches', payload: { ...base(), data: { columns }, pool: pool.slice(0, 17), top: 3 } });
  t.equal(heuristic.statusCode, 200, heuristic.body.slice(0, 300));
  const body = heuristic.json();
  t.equal(body.method, 'stepwiseSwaps');
  t.equal(body.proven, false);
  t.equal(body.weightsCoverAllSubsets, false);
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'search_heuristic'), 'the heuristic is named in a caution');
  t.match(body.glm.searchRule, /stepwise selection with swaps/);
  t.ok(body.budget.nodes <= body.budget.maxNodes, 'within the fits the price allowed');
});

t.test('Accept: text/event-stream: one progress event, then the recorded result; a refusal is a plain 422', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/searches', headers: { accept: 'text/event-stream' }, payload: base() });
  t.equal(res.statusCode, 200);
  t.match(res.headers['content-type'], /^text\/event-stream/);
  const events = res.body.trim().split('\n\n').map((block) => block.split('\n')[0].replace('event: ', ''));
  t.same(events, ['progress', 'result']);
  const result = JSON.parse(res.body.trim().split('\n\n')[1].split('\n')[1].replace('data: ', ''));
  t.equal((await store.get(result.id))?.kind, 'search', 'recorded before the result was sent');
  const bad = await app.inject({ method: 'POST', url: '/v1/searches', headers: { accept: 'text/event-stream' }, payload: { ...base(), link: 'sqrt' } });
  t.equal(bad.statusCode, 422, 'a GLM search refused by its family\'s checks is answered with its status, not a stream');
});
