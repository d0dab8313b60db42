// POST /v1/comparisons/{id}/replay: today's code against the stored result.
// A record written by "an older version" is made by appending a result that
// differs from today's in known places; the replay must find exactly those.
import t, { type Test } from 'tap';
import { requestDigest } from '../../src/audit/open.ts';
import { recordedForReplay } from './replay-setup.ts';

// Demo scenario (invented): a small shrinkage data set.
function smallComparison() {
  const peakTemp = [1150, 1160, 1175, 1190, 1200, 1215, 1230, 1240, 1250, 1255];
  return {
    data: { columns: { peakTemp, shrinkage: peakTemp.map((x, j) => 5 + 0.012 * (x - 1150) - 0.00003 * (x - 1150) ** 2 + ((j * 7) % 5) / 40) } },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'quadratic', terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }] }],
    label: 'replay check',
  };
}

const setup = (t: Test) => recordedForReplay(t, 'comparisons', smallComparison());

t.test('a record made by today\'s code replays identically, and the replay is not recorded', async (t) => {
  const { record, replay, chainLength } = await setup(t);
  const before = await chainLength();
  const res = await replay(record.id);
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  t.equal(body.id, record.id);
  t.equal(body.identical, true);
  t.same(body.changes, []);
  t.ok(body.valuesCompared > 50, `${body.valuesCompared} values compared`);
  t.same(body.serviceVersion, { stored: record.serviceVersion, now: record.serviceVersion });
  t.same(body.conventionsVersion, { stored: record.conventionsVersion, now: record.conventionsVersion });
  t.ok(Math.abs(Date.parse(body.replayedAt) - Date.now()) < 60_000, 'replayedAt is now');
  t.same(body.policy, { stored: record.policy, now: record.policy }, 'replayed under the policy it was recorded with');
  t.match(body.summary, /reproduces all \d+ values/);
  t.notMatch(body.summary, /policy/);
  t.equal(await chainLength(), before, 'no audit record appended');
});

t.test('an older result: exactly the changed number, the reordered ranking and the changed choice', async (t) => {
  const { store, record, replay } = await setup(t);
  const today = structuredClone(record.result) as Record<string, any>;
  const older = structuredClone(today);
  older.models[1].aicc += 0.5;
  // The older version ranked the two models the other way round.
  const [first, second] = older.rankings.aicc;
  older.rankings.aicc = [{ ...second, rank: first.rank }, { ...first, rank: second.rank }];
  older.verdict.chosen = second.name;
  const stored = await store.append({
    kind: 'comparison', caller: 'anonymous', label: 'older', serviceVersion: '0.0.9', conventionsVersion: record.conventionsVersion,
    policy: null, datasetFingerprint: record.datasetFingerprint, requestDigest: record.requestDigest, request: record.request, result: older,
  });
  const body = (await replay(stored.id)).json();
  t.equal(body.identical, false);
  t.same(body.serviceVersion, { stored: '0.0.9', now: record.serviceVersion });
  const byPath = Object.fromEntries(body.changes.map((c: { path: string }) => [c.path, c]));
  t.same(Object.keys(byPath).sort(), ['models/1/aicc', 'rankings/aicc/0/rank', 'rankings/aicc/1/rank', 'verdict/chosen'],
    'a reordering reads as rank changes, not as every number of the ranking changing');
  const aicc = byPath['models/1/aicc'];
  t.equal(aicc.stored, older.models[1].aicc);
  t.equal(aicc.now, today.models[1].aicc);
  t.ok(Math.abs(aicc.absoluteChange + 0.5) < 1e-9, 'now − stored = −0.5');
  t.ok(Math.abs(aicc.relativeChange - -0.5 / Math.abs(older.models[1].aicc)) < 1e-12);
  // second (today's runner-up) was listed first in the older ranking.
  t.same(byPath['rankings/aicc/0/rank'], {
    path: 'rankings/aicc/0/rank', change: 'value', nowPath: 'rankings/aicc/1/rank',
    stored: first.rank, now: second.rank, absoluteChange: second.rank - first.rank, relativeChange: (second.rank - first.rank) / first.rank,
  });
  t.same(byPath['verdict/chosen'], { path: 'verdict/chosen', change: 'value', stored: second.name, now: first.name, absoluteChange: null, relativeChange: null });
  t.match(body.summary, /4 of \d+ stored values differ/);
  t.equal(body.policy.stored, null, 'a record made before policies');
  t.match(body.summary, /policy in force differs from the one recorded/);
  t.match(body.summary, new RegExp(`chosen model changes from ${second.name} to ${first.name}`));
});

t.test('409 when there is nothing to replay or it no longer runs', async (t) => {
  const { store, record, replay } = await setup(t);
  const base = {
    kind: 'comparison' as const, caller: 'anonymous', label: null, serviceVersion: '0.0.9', conventionsVersion: '1', policy: null,
    datasetFingerprint: null, result: record.result,
  };
  const digestOnly = await store.append({ ...base, requestDigest: record.requestDigest, request: null });
  const res = await replay(digestOnly.id);
  t.equal(res.statusCode, 409);
  t.match(res.headers['content-type'], /application\/problem\+json/);
  t.match(res.json().detail, /digest-only/);

  // Valid once, refused by today's schema: a term kind this service does not know.
  const invalid = structuredClone(record.request) as Record<string, any>;
  invalid.candidates[0].terms = [{ kind: 'spline', of: 'peakTemp', knots: 3 }];
  const gone = await store.append({ ...base, requestDigest: requestDigest(invalid), request: invalid });
  const refused = (await replay(gone.id)).json();
  t.equal(refused.status, 409);
  t.ok(refused.errors.length > 0);
  t.ok(refused.errors.every((e: { path: string }) => e.path.startsWith('candidates/0')), JSON.stringify(refused.errors));
  t.match(refused.detail, /today's request schema/);

  // Valid under the schema, but cannot be computed: a term names a column the data lack.
  const uncomputable = structuredClone(record.request) as Record<string, any>;
  uncomputable.candidates[0].terms = ['holdMinutes'];
  const stuck = await store.append({ ...base, requestDigest: requestDigest(uncomputable), request: uncomputable });
  const cannot = (await replay(stuck.id)).json();
  t.equal(cannot.status, 409);
  t.match(cannot.detail, /cannot compute/);
  t.ok(cannot.errors.some((e: { path: string }) => e.path.startsWith('candidates/0')), JSON.stringify(cannot.errors));
});

t.test('unknown and malformed ids', async (t) => {
  const { replay } = await setup(t);
  const unknown = await replay('01890a5d-ac96-774b-bcce-b302099a8057');
  t.equal(unknown.statusCode, 404);
  t.equal(unknown.json().type, 'urn:parsimetry:problem:not-found');
  const bad = await replay('x');
  t.equal(bad.statusCode, 400);
  t.equal(bad.json().errors[0].path, 'id');
});
