// POST /v1/searches against POST /v1/comparisons with every subset of the
// pool as a candidate (the brute force the issue asks for): the same best
// models with the same numbers (the refits are the comparison's own QR fits,
// so to the last digit), weights and importance over every subset to 1e-9
// (weights by their definition in api.md: exp(-Δ/2) / Σ exp(-Δ_j/2)).
// Data: the demo scenario's generator (scripts/demo-data.ts); for branch and
// bound, correlated readings (scripts/wide-pool-data.ts).
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoColumns } from '../../scripts/demo-data.ts';
import { widePool } from '../../scripts/wide-pool-data.ts';
import type { Term } from '../../src/core/types.ts';

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

const pool12: Term[] = [
  'peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' },
  { kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'power', of: 'holdMinutes', degree: 2 },
  { kind: 'power', of: 'moisture', degree: 2 }, { kind: 'product', of: ['peakTemp', 'holdMinutes'] },
  { kind: 'product', of: ['peakTemp', 'moisture'] }, { kind: 'product', of: ['holdMinutes', 'moisture'] },
  { kind: 'product', of: ['peakTemp', 'kiln'] }, { kind: 'product', of: ['moisture', 'kiln'] },
];

/** The marginality rule written out for these term forms (independent of src/core/search/hierarchy.ts). */
function admissible(terms: Term[]): boolean {
  const has = (column: string) => terms.some((u) => u === column || (typeof u === 'object' && u.kind === 'factor' && u.of === column));
  return terms.every((u) => typeof u === 'string' || u.kind === 'factor' || (u.kind === 'power' ? has(u.of) : u.kind === 'product' ? u.of.every(has) : true));
}

type Model = { name: string; terms: Term[]; aic: number; aicc: number; bic: number; hqc: number; rss: number; logLikelihood: number; parameters: number; coefficients: unknown[]; delta: number; weight: number };

/** Every subset of `pool` (admissible ones only with hierarchy), scored by comparisons of at most 200 candidates. */
async function bruteForce(app: Awaited<ReturnType<typeof buildTestApp>>['app'], pool: Term[], hierarchy: boolean, criterion: 'aicc' | 'bic') {
  const columns = demoColumns();
  const subsets: Term[][] = [];
  for (let mask = 0; mask < 2 ** pool.length; mask++) {
    const terms = pool.filter((_, j) => (mask >>> j) & 1);
    if (!hierarchy || admissible(terms)) subsets.push(terms);
  }
  const models: Model[] = [];
  for (let from = 0; from < subsets.length; from += 200) {
    const candidates = subsets.slice(from, from + 200).map((terms, i) => ({ name: `s${from + i}`, terms }));
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns }, response: 'shrinkage', candidates } });
    if (res.statusCode !== 200) throw new Error(res.body);
    res.json().models.forEach((m: Model, i: number) => models.push({ ...m, terms: candidates[i].terms }));
  }
  const best = Math.min(...models.map((m) => m[criterion]));
  const total = models.reduce((s, m) => s + Math.exp(-(m[criterion] - best) / 2), 0);
  for (const m of models) {
    m.delta = m[criterion] - best;
    m.weight = Math.exp(-m.delta / 2) / total;
  }
  models.sort((a, b) => a[criterion] - b[criterion] || a.terms.length - b.terms.length);
  const importance = pool.map((term) => models.filter((m) => m.terms.some((u) => JSON.stringify(u) === JSON.stringify(term))).reduce((s, m) => s + m.weight, 0));
  return { models, importance };
}

for (const [name, pool, hierarchy, criterion, top] of [
  ['6-term pool, every subset', pool12.slice(0, 6), false, 'aicc', 64],
  ['12-term pool with hierarchy', pool12, true, 'bic', 25],
] as const) {
  t.test(`search equals a comparison of every subset: ${name}`, async (t) => {
    // Thousands of candidates keep the event loop busy; load shedding would refuse them.
    const { app, store } = await buildTestApp(t, { eventLoopMaxDelayMs: 0 });
    const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: demoColumns() }, response: 'shrinkage', pool, hierarchy, rankBy: criterion, top } });
    t.equal(res.statusCode, 200, res.body.slice(0, 400));
    const body = res.json();
    const reference = await bruteForce(app, [...pool], hierarchy, criterion);
    t.equal(body.evaluated, reference.models.length, 'every admissible subset evaluated');
    t.equal(body.subsets, 2 ** pool.length);
    t.ok(body.weightsCoverAllSubsets);
    t.equal(body.models.length, Math.min(top, reference.models.length));
    body.models.forEach((m: Model, i: number) => {
      const r = reference.models[i];
      t.same(m.terms, r.terms, `model ${i}: same terms`);
      for (const key of ['aic', 'aicc', 'bic', 'hqc', 'rss', 'logLikelihood', 'parameters'] as const) t.equal(m[key], r[key], `model ${i}: ${key} to the last digit`);
      t.same(m.coefficients, r.coefficients, `model ${i}: coefficients`);
      t.ok(close(m.delta, r.delta), `model ${i}: delta`);
      t.ok(close(m.weight, r.weight), `model ${i}: weight ${m.weight} vs ${r.weight}`);
    });
    t.ok(body.importance.every((x: { weight: number }, j: number) => close(x.weight, reference.importance[j])), 'importance over every subset');
    t.same(body.importance.map((x: { term: Term }) => x.term), pool, 'importance per pool term, in the request\'s forms');
    const record = await store.get(body.id);
    t.equal(record?.kind, 'search', 'an audit record of kind search');
    t.equal((record?.result as { evaluated?: number }).evaluated, body.evaluated);
  });
}

t.test('budget, rankBy and the request\'s problems', async (t) => {
  const { app } = await buildTestApp(t);
  const rows = 40;
  const columns: Record<string, number[]> = { y: Array.from({ length: rows }, (_, i) => Math.sin(i)) };
  const pool = Array.from({ length: 25 }, (_, j) => `x${j}`);
  for (const c of pool) columns[c] = Array.from({ length: rows }, (_, i) => Math.cos(i * (pool.indexOf(c) + 2)));
  const over = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'y', pool, exhaustive: true } });
  t.equal(over.statusCode, 422);
  t.equal(over.json().errors[0].code, 'search_over_budget');
  t.equal(over.json().errors[0].budget, 'maxSubsets', 'the 422 names the budget');
  t.equal(over.json().errors[0].required, 2 ** 25);
  const wide = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: { ...columns, ...Object.fromEntries(Array.from({ length: 20 }, (_, j) => [`z${j}`, columns.y.map((v, i) => v * ((i * (j + 3)) % 7))])) } }, response: 'y', pool: [...pool, ...Array.from({ length: 20 }, (_, j) => `z${j}`)] } });
  t.equal(wide.json().errors?.[0]?.budget, 'maxBranchAndBoundTerms', 'a 45-term pool is beyond branch and bound');
  const r2 = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'y', pool: ['x1'], rankBy: 'adjustedR2' } });
  t.equal(r2.statusCode, 400);
  t.match(r2.json().detail, /adjustedR2 has no Akaike weights/);
  const unknown = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns }, response: 'y', pool: ['x1', 'nope'] } });
  t.equal(unknown.statusCode, 422);
  t.equal(unknown.json().errors[0].path, 'pool/1', 'issues point into the pool');
});

t.test('Accept: text/event-stream streams progress and ends with the recorded result', async (t) => {
  const { app, store } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/searches', headers: { accept: 'text/event-stream' },
    payload: { data: { columns: demoColumns() }, response: 'shrinkage', pool: pool12, top: 5 },
  });
  t.equal(res.statusCode, 200);
  t.match(res.headers['content-type'], /^text\/event-stream/);
  const events = res.body.trim().split('\n\n').map((block) => {
    const [event, data] = block.split('\n');
    return { event: event.replace('event: ', ''), data: JSON.parse(data.replace('data: ', '')) };
  });
  t.ok(events.length >= 2);
  t.ok(events.slice(0, -1).every((e) => e.event === 'progress' && e.data.covered <= e.data.total && e.data.total === 4096), 'progress events first');
  const last = events.at(-1)!;
  t.equal(last.event, 'result');
  t.equal(last.data.models.length, 5);
  t.equal((await store.get(last.data.id))?.kind, 'search', 'recorded before the result was sent');
  const bad = await app.inject({ method: 'POST', url: '/v1/searches', headers: { accept: 'text/event-stream' }, payload: { data: { columns: demoColumns() }, response: 'nope', pool: ['peakTemp'] } });
  t.equal(bad.statusCode, 422, 'a search that cannot start is answered with its status, not a stream');
});

t.test('what a search passed over is in the response, and requests it cannot score honestly are refused', async (t) => {
  const { app } = await buildTestApp(t);
  const d = demoColumns();
  const rows = d.peakTemp.map((_, i) => i).filter((i) => d.moisture[i] !== null && d.shrinkage[i] !== null);
  const peakTemp = rows.map((i) => d.peakTemp[i] as number);
  const moisture = rows.map((i) => d.moisture[i] as number);
  const holdMinutes = rows.map((i) => d.holdMinutes[i] as number);
  // total = peakTemp + moisture: three subsets repeat {peakTemp, moisture}; y computed from peakTemp and holdMinutes fits exactly.
  const total = peakTemp.map((x, i) => x + moisture[i]);
  const exact = peakTemp.map((x, i) => 0.013 * x - 0.7 + 0.021 * holdMinutes[i]);
  const shrinkage = rows.map((i) => d.shrinkage[i] as number);
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: { shrinkage, peakTemp, moisture, total } }, response: 'shrinkage', pool: ['peakTemp', 'moisture', 'total'] } });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  t.same(body.passedOver, { notHierarchical: 0, unscorable: 0, pruned: 0, rankDeficient: 1, sameColumnSpace: 2, exactFit: 0 });
  t.equal(body.evaluated, 5, 'five distinct models');
  t.match(body.conventions.rank, /sweeping cross products/, 'the rank rule names the sweep that screened the subsets');
  const fits = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: { y: exact, peakTemp, holdMinutes, moisture } }, response: 'y', pool: ['peakTemp', 'holdMinutes', 'moisture'] } });
  t.equal(fits.statusCode, 200, fits.body.slice(0, 300));
  t.equal(fits.json().passedOver.exactFit, 2);
  t.ok(fits.json().models.every((m: { aicc: number | null; weight: number }) => m.aicc !== null && Number.isFinite(m.weight)), 'no listed model without a criterion');
  t.ok(fits.json().cautions.some((c: { code: string }) => c.code === 'exact_fit_subsets'));
  const g = rows.map((_, i) => 1 + (i % 3));
  const coding = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: { shrinkage, g, moisture } }, response: 'shrinkage', pool: [{ kind: 'factor', of: 'g' }, { kind: 'product', of: ['g', 'moisture'] }] } });
  t.equal(coding.statusCode, 422);
  t.same(coding.json().errors.map((e: { code: string; path: string }) => [e.code, e.path]), [['search_coding_varies', 'pool/1']]);
  const hierarchy = await app.inject({ method: 'POST', url: '/v1/searches', payload: { data: { columns: { shrinkage, peakTemp, moisture } }, response: 'shrinkage', pool: ['peakTemp', 'moisture'], always: [{ kind: 'power', of: 'peakTemp', degree: 2 }], hierarchy: true } });
  t.equal(hierarchy.statusCode, 422);
  t.equal(hierarchy.json().errors[0].code, 'hierarchy_always_incomplete');
});

t.test('a pool beyond exhaustive reach: branch and bound, proven, with nodes and the bound in progress events', async (t) => {
  const { app, store } = await buildTestApp(t);
  // 26 correlated readings (scripts/wide-pool-data.ts): 2^26 subsets, beyond the exhaustive budget of 2^24.
  const wide = widePool({ terms: 26, rows: 300, seed: 7 });
  const payload = { data: { columns: wide.columns }, response: wide.response, pool: wide.pool, rankBy: 'bic', top: 5 };
  const res = await app.inject({ method: 'POST', url: '/v1/searches', headers: { accept: 'text/event-stream' }, payload });
  t.equal(res.statusCode, 200);
  const events = res.body.trim().split('\n\n').map((block) => {
    const [event, data] = block.split('\n');
    return { event: event.replace('event: ', ''), data: JSON.parse(data.replace('data: ', '')) };
  });
  const result = events.at(-1)!;
  t.equal(result.event, 'result');
  const body = result.data;
  t.equal(body.method, 'branchAndBound');
  t.equal(body.proven, true, 'proven');
  t.equal(body.models.length, 5);
  t.equal(body.subsets, 2 ** 26);
  t.ok(body.passedOver.pruned > 0 && body.weightsCoverAllSubsets === false, 'pruned, and weights say they cover the evaluated subsets');
  t.equal(body.evaluated + body.passedOver.pruned + body.passedOver.notHierarchical + body.passedOver.rankDeficient + body.passedOver.sameColumnSpace + body.passedOver.exactFit + body.passedOver.unscorable, 2 ** 26, 'every subset accounted for');
  t.ok(body.budget.nodes > 0, 'nodes visited are stated');
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'weights_over_evaluated_subsets'));
  t.notOk(body.cautions.some((c: { code: string }) => c.code === 'search_not_proven'));
  const progress = events.slice(0, -1).map((e) => e.data);
  t.ok(progress.every((p) => 'nodes' in p && 'bound' in p), 'progress events carry nodes and the bound');
  const last = progress.at(-1);
  t.ok(last.bound === null || last.bound >= body.models[4].bic - 1e-6, 'the bound is never below the last listed model\'s value');
  t.equal((await store.get(body.id))?.kind, 'search', 'recorded');
  const exhaustive = await app.inject({ method: 'POST', url: '/v1/searches', payload: { ...payload, exhaustive: true } });
  t.equal(exhaustive.statusCode, 422, 'exhaustive: true refuses instead');
});
