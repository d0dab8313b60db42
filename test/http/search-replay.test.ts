// POST /v1/searches/{id}/replay: today's code against a stored search. A
// record written by "an older version" is made by appending a result that
// differs from today's in known places; the replay must find exactly those,
// and nothing that only measures the run (threads, wall time, nodes).
// Data: the demo scenario's generator (scripts/demo-data.ts).
import t, { type Test } from 'tap';
import { requestDigest } from '../../src/audit/open.ts';
import { withoutRunMeasures } from '../../src/http/routes/search-replay.ts';
import { recordedForReplay } from './replay-setup.ts';
import { demoColumns } from '../../scripts/demo-data.ts';

const searchBody = () => ({
  data: { columns: demoColumns() }, response: 'shrinkage', label: 'replay of a search',
  pool: ['peakTemp', 'holdMinutes', 'moisture', { kind: 'power', of: 'peakTemp', degree: 2 }], responseTransform: { fn: 'log' }, top: 5,
});

const setup = (t: Test) => recordedForReplay(t, 'searches', searchBody(), { 'content-type': 'application/json' });

t.test('a search made by today\'s code replays identically, and the replay appends no record', async (t) => {
  const { record, replay, chainLength } = await setup(t);
  const before = await chainLength();
  const res = await replay(record.id);
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  t.equal(body.id, record.id);
  t.equal(body.identical, true, JSON.stringify(body.changes).slice(0, 300));
  t.ok(body.valuesCompared > 100, `${body.valuesCompared} values compared`);
  t.match(body.summary, new RegExp(`reproduces all ${body.valuesCompared} values`));
  t.equal(await chainLength(), before, 'no audit record appended');
});

t.test('an older search result: exactly the changed numbers and the changed best subset', async (t) => {
  const { store, record, replay } = await setup(t);
  const today = structuredClone(record.result) as Record<string, any>;
  const older = structuredClone(today);
  older.models[0].aicc += 0.25;
  older.importance[2].weight = 0.5;
  // The older version put the runner-up first; its wall time and threads differ, as any run's do.
  older.models = [{ ...older.models[1] }, { ...older.models[0] }, ...older.models.slice(2)];
  older.budget.elapsedMs += 1000;
  older.threads += 3;
  const stored = await store.append({
    kind: 'search', caller: 'anonymous', label: 'older', serviceVersion: '0.0.9', conventionsVersion: record.conventionsVersion,
    policy: record.policy, datasetFingerprint: record.datasetFingerprint, requestDigest: record.requestDigest, request: record.request, result: older,
  });
  const body = (await replay(stored.id)).json();
  t.equal(body.identical, false);
  const paths = body.changes.map((c: { path: string }) => c.path).sort();
  t.ok(paths.includes('importance/2/weight'), 'the edited importance');
  t.ok(paths.some((p: string) => p.endsWith('/aicc')), 'the edited criterion value');
  t.notOk(paths.some((p: string) => p.startsWith('threads') || p.startsWith('budget')), 'what the run measured is not compared');
  const aicc = body.changes.find((c: { path: string }) => c.path.endsWith('/aicc'));
  t.ok(Math.abs(aicc.absoluteChange + 0.25) < 1e-9, 'now − stored = −0.25');
  t.match(body.summary, new RegExp(`chosen model changes from ${today.models[1].name.replace(/[+^()]/g, '\\$&')} to ${today.models[0].name.replace(/[+^()]/g, '\\$&')}`));
});

t.test('409 when there is nothing to replay or it no longer runs; 404 for a comparison\'s id', async (t) => {
  const { app, store, record, replay } = await setup(t);
  const base = { kind: 'search' as const, caller: 'anonymous', label: null, serviceVersion: '0.0.9', conventionsVersion: '2', policy: null, datasetFingerprint: null, result: record.result };
  const digestOnly = await store.append({ ...base, requestDigest: record.requestDigest, request: null });
  const res = await replay(digestOnly.id);
  t.equal(res.statusCode, 409);
  t.match(res.json().detail, /search .* digest-only/);
  const invalid = { ...(record.request as Record<string, unknown>), pool: [{ kind: 'spline', of: 'peakTemp' }] };
  const refused = await replay((await store.append({ ...base, requestDigest: requestDigest(invalid), request: invalid })).id);
  t.equal(refused.statusCode, 409);
  t.ok(refused.json().errors.every((e: { path: string }) => e.path.startsWith('pool/0')), refused.body);
  const uncomputable = { ...(record.request as Record<string, unknown>), pool: ['peakTemp', 'furnaceLoad'] };
  const stuck = await replay((await store.append({ ...base, requestDigest: requestDigest(uncomputable), request: uncomputable })).id);
  t.equal(stuck.statusCode, 409);
  t.match(stuck.json().detail, /cannot compute/);
  t.ok(stuck.json().errors.some((e: { path: string }) => e.path === 'pool/1'), stuck.body);
  const comparison = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { data: { columns: demoColumns() }, response: 'shrinkage', candidates: [{ name: 'a', terms: ['peakTemp'] }, { name: 'b', terms: ['moisture'] }] } });
  const wrongKind = await replay(comparison.json().id);
  t.equal(wrongKind.statusCode, 404);
  t.match(wrongKind.json().detail, /is a comparison, not a search/);
});

t.test('withoutRunMeasures leaves everything but the run\'s own measures', async (t) => {
  t.same(withoutRunMeasures({ a: 1, threads: 2, budget: { maxNodes: 5, nodes: 7, elapsedMs: 3 } }), { a: 1, budget: { maxNodes: 5 } });
  t.same(withoutRunMeasures({ a: 1 }), { a: 1 }, 'no budget, nothing added');
  t.same(withoutRunMeasures({ budget: 'odd' }), { budget: 'odd' }, 'an old record of another shape is compared as it is');
});
