// The fitted-elsewhere forms, the fingerprint and the team policy through HTTP.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';
import { loadPolicyFile, PolicyFileError, DEFAULT_ACTIVE_POLICY } from '../../src/policy-file.ts';
import { canonicalJson, sha256Hex } from '../../src/audit/chain.ts';

const small = {
  data: { columns: { y: [3.1, 3.9, 5.2, 5.8, 7.1, 7.9, 9.2, 9.8], x: [1, 2, 3, 4, 5, 6, 7, 8] } },
  response: 'y',
};

t.test('a malformed candidate form is reported at the field of the form it resembles', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...small, candidates: [{ name: 'r', residuals: [0.1, -0.1], parameters: 0 }] } });
  t.equal(res.statusCode, 400);
  t.same(res.json().errors.map((e: { path: string }) => e.path), ['candidates/0/parameters']);
  const none = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...small, candidates: [{ name: 'r' }] } });
  t.equal(none.statusCode, 400);
  t.match(none.json().errors[0], { path: 'candidates/0', message: /^a candidate is one of: \{ name, terms/ });
});

t.test('the dataset fingerprint is stable, sensitive, and computable in Python from the README recipe', async (t) => {
  const { app } = await buildTestApp(t);
  const request = demoComparison();
  const post = async (body: unknown) => (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: body as object })).json();
  const a = await post(request);
  const b = await post({ ...request, candidates: [...request.candidates].reverse() });
  t.equal(a.dataset.fingerprint, b.dataset.fingerprint, 'order of candidates is irrelevant');
  const changed = structuredClone(request);
  changed.data.columns.shrinkage[0] = (changed.data.columns.shrinkage[0] as number) + 0.001;
  t.not((await post(changed)).dataset.fingerprint, a.dataset.fingerprint, 'one value changed, another fingerprint');
  const python = execFileSync('python3', ['examples/fingerprint.py'], { input: JSON.stringify(request) }).toString().trim();
  t.equal(python, a.dataset.fingerprint, 'examples/fingerprint.py (standard library only) agrees');

  const expected = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...request, datasetFingerprint: a.dataset.fingerprint } });
  t.equal(expected.statusCode, 200, 'a matching expectation passes');
  const wrong = `sha256:${'0'.repeat(64)}`;
  const mismatch = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...request, datasetFingerprint: wrong } });
  t.equal(mismatch.statusCode, 422);
  const err = mismatch.json().errors[0];
  t.equal(err.path, 'datasetFingerprint');
  t.equal(err.expected, wrong);
  t.equal(err.actual, a.dataset.fingerprint, 'both fingerprints named');
});

t.test('examples/fingerprint.py agrees with the service for summary requests and zero weights', async (t) => {
  const { app } = await buildTestApp(t);
  const summary = {
    rows: 5, columns: ['x', 'y'], means: [3, -0.2],
    centredCrossProducts: [[10, 7.5], [7.5, 6.8]],
  };
  const weighted = { ...summary, weights: { sum: 6.5, sumLog: 0.4 } };
  for (const s of [summary, weighted]) {
    const request = { data: { summary: s }, response: 'y', candidates: [{ name: 'line', terms: ['x'] }, { name: 'mean', terms: [] }] };
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request });
    t.equal(res.statusCode, 200, res.body.slice(0, 200));
    const python = execFileSync('python3', ['examples/fingerprint.py'], { input: JSON.stringify(request) }).toString().trim();
    t.equal(python, res.json().dataset.fingerprint, `summary${s === weighted ? ' (weighted)' : ''}: the script computes the service's fingerprint`);
  }
  // A zero weight leaves its row out of the fingerprint as out of the fit.
  const rows = { ...small, data: { columns: { ...small.data.columns, w: [1, 0, 2, 1, 1, 0, 1, 2] } }, weights: 'w', candidates: [{ name: 'line', terms: ['x'] }] };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: rows });
  const python = execFileSync('python3', ['examples/fingerprint.py'], { input: JSON.stringify(rows) }).toString().trim();
  t.equal(python, res.json().dataset.fingerprint, 'zero weights: the same rows left out');
});

t.test('every response names its policy and hash; each ranking entry carries its Δ band', async (t) => {
  const { app } = await buildTestApp(t);
  const body = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).json();
  t.same(body.policy, { name: 'parsimetry-default', hash: DEFAULT_ACTIVE_POLICY.hash });
  t.equal(body.policy.hash, `sha256:${sha256Hex(canonicalJson(DEFAULT_ACTIVE_POLICY.policy))}`);
  for (const e of body.rankings.aicc) {
    // Burnham & Anderson (2002) bands: Δ ≤ 2 substantial support; > 10 essentially none.
    if (e.delta <= 2) t.equal(e.band, 'substantial support');
    if (e.delta > 10) t.equal(e.band, 'essentially no support');
  }
  t.ok(body.rankings.adjustedR2.every((e: { band: null }) => e.band === null));
  t.equal(body.conventions.rankBy, 'aicc');
  t.match(body.conventions.rankByReason, /default of policy/);
});

t.test('a team policy file sets rankBy, and AIC gives way to AICc when n/k < 40', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-policy-'));
  const file = join(dir, 'policy.json');
  writeFileSync(file, JSON.stringify({ name: 'kiln-team', rankBy: 'aic', confidenceLevel: 0.9 }));
  const policy = loadPolicyFile(file);
  t.equal(policy.policy.preferAiccBelowRatio, 40, 'defaults filled in before hashing');
  const { app } = await buildTestApp(t, {}, { policy });
  const body = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() })).json();
  t.same(body.policy, { name: 'kiln-team', hash: policy.hash });
  t.not(policy.hash, DEFAULT_ACTIVE_POLICY.hash);
  t.equal(body.conventions.confidenceLevel, 0.9);
  // Demo: n = 116, largest k = 9 → n/k = 12.9 < 40 (Burnham & Anderson's rule of thumb).
  t.equal(body.conventions.rankBy, 'aicc');
  t.match(body.conventions.rankByReason, /switched to AICc because n\/k = 12\.9/);
  const asked = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), options: { rankBy: 'aic' } } })).json();
  t.equal(asked.conventions.rankBy, 'aic', 'the request\'s own choice stands');
  t.ok(asked.cautions.some((c: { code: string }) => c.code === 'small_sample_aic'));
});

t.test('a malformed policy file is refused at start with the field named', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-policy-'));
  const file = join(dir, 'policy.json');
  writeFileSync(file, JSON.stringify({ name: 'x', rankBy: 'r2' }));
  let error: unknown;
  try { loadPolicyFile(file); } catch (e) { error = e; }
  t.ok(error instanceof PolicyFileError, 'a PolicyFileError');
  t.match((error as Error).message, /rankBy/);
});
