// Models fitted elsewhere are scored by the same convention as models fitted
// here. References: the Gaussian log-likelihood as the sum of normal log-
// densities at the ML variance σ̂² = RSS/n (the standard likelihood; computed
// with @stdlib's normal logpdf), and the log-normal density for a model of
// log(y) (computed with @stdlib's lognormal logpdf), i.e. the Jacobian rule.
import t from 'tap';
import normalLogpdf from '@stdlib/stats-base-dists-normal-logpdf';
import lognormalLogpdf from '@stdlib/stats-base-dists-lognormal-logpdf';
import { compareModels, type CandidateInput, type ComparisonInput } from '../../../src/core/compare.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';


// A small data set for identities (not a reference number): a straight line
// with fixed, hand-written departures.
const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
const bumps = [0.3, -0.2, 0.1, 0.4, -0.5, 0.2, -0.1, 0.0, 0.3, -0.4, 0.2, -0.1];
const y = x.map((v, i) => 2 + 0.7 * v + bumps[i]);

function input(candidates: CandidateInput[], extra: Partial<ComparisonInput> = {}): ComparisonInput {
  return {
    columns: { y, x }, response: 'y', weights: null, candidates,
    policy: DEFAULT_POLICY, policyHash: 'sha256:test', ...extra,
  };
}

function run(i: ComparisonInput) {
  const r = compareModels(i);
  if ('issues' in r) throw new Error(JSON.stringify(r.issues));
  return r.result;
}

/** Plain least squares of y on (1, x), by the textbook closed form. */
function lineResiduals(xs: number[], ys: number[]): number[] {
  const n = xs.length;
  const mx = xs.reduce((a, b) => a + b) / n;
  const my = ys.reduce((a, b) => a + b) / n;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < n; i++) { sxy += (xs[i] - mx) * (ys[i] - my); sxx += (xs[i] - mx) ** 2; }
  const b = sxy / sxx;
  return ys.map((v, i) => v - (my - b * mx) - b * xs[i]);
}

const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));

t.test('residuals, rss and logLikelihood forms give the criteria of the formula applied by hand', async (t) => {
  const e = lineResiduals(x, y);
  const n = e.length;
  const rss = e.reduce((s, v) => s + v * v, 0);
  const sigmaMl = Math.sqrt(rss / n);
  const byHand = e.reduce((s, v) => s + normalLogpdf(v, 0, sigmaMl), 0);
  const k = 3;
  const r = run(input([
    { form: 'fit', name: 'here', terms: ['x'], intercept: true },
    { form: 'residuals', name: 'by-residuals', residuals: e, parameters: k },
    { form: 'rss', name: 'by-rss', rss, parameters: k, observations: n },
    { form: 'logLikelihood', name: 'by-likelihood', logLikelihood: byHand, parameters: k, observations: n, estimation: 'ml' },
  ]));
  for (const m of r.models) {
    t.ok(rel(m.logLikelihood!, byHand) < 1e-12, `${m.name}: logL ${m.logLikelihood} vs Σ log N(e; 0, σ̂²) ${byHand}`);
    t.ok(rel(m.aic!, -2 * byHand + 2 * k) < 1e-12, `${m.name}: aic`);
    t.ok(rel(m.aicc!, -2 * byHand + 2 * k + (2 * k * (k + 1)) / (n - k - 1)) < 1e-12, `${m.name}: aicc`);
    t.ok(rel(m.bic!, -2 * byHand + k * Math.log(n)) < 1e-12, `${m.name}: bic`);
    t.ok(rel(m.hqc!, -2 * byHand + 2 * k * Math.log(Math.log(n))) < 1e-12, `${m.name}: hqc`);
  }
  const here = r.models.find((m) => m.name === 'here')!;
  const byRss = r.models.find((m) => m.name === 'by-rss')!;
  t.ok(rel(byRss.r2!, here.r2!) < 1e-12, 'R² of an RSS sent from elsewhere equals the fit here');
  t.ok(rel(byRss.adjustedR2!, here.adjustedR2!) < 1e-12, 'adjusted R² with p = k − 1');
  t.equal(r.models.find((m) => m.name === 'by-likelihood')!.r2, null, 'no R² from a likelihood alone');
  t.equal(byRss.source, 'rss');
});

t.test('residuals line up with rows: one per used row, or one per data row with null where a row is dropped', async (t) => {
  const withGap = { y, x: x.map((v, i) => (i === 4 ? null : v)) };
  const e = lineResiduals(x.filter((_, i) => i !== 4), y.filter((_, i) => i !== 4));
  const perDataRow = [...e.slice(0, 4), null, ...e.slice(4)];
  const base = { columns: withGap };
  const a = run(input([{ form: 'fit', name: 'here', terms: ['x'], intercept: true }, { form: 'residuals', name: 'used', residuals: e, parameters: 3 }], base));
  const b = run(input([{ form: 'fit', name: 'here', terms: ['x'], intercept: true }, { form: 'residuals', name: 'used', residuals: perDataRow, parameters: 3 }], base));
  t.equal(a.dataset.rowsDropped, 1);
  t.equal(a.models[1].logLikelihood, b.models[1].logLikelihood, 'both alignments give the same likelihood');
  t.ok(rel(a.models[1].logLikelihood!, a.models[0].logLikelihood!) < 1e-12, 'and that of the same model fitted here');

  const refuse = (residuals: (number | null)[]) => {
    const out = compareModels(input([{ form: 'fit', name: 'here', terms: ['x'], intercept: true }, { form: 'residuals', name: 'r', residuals, parameters: 3 }], base));
    return 'issues' in out ? out.issues[0] : null;
  };
  const wrongCount = refuse(e.slice(1));
  t.equal(wrongCount?.code, 'residuals_count_mismatch');
  t.match(wrongCount?.message, /10 residuals.*\(11\).*\(12\)/, 'names both counts');
  const atDropped = refuse([...e.slice(0, 4), 0.1, ...e.slice(4)]);
  t.equal(atDropped?.code, 'residual_at_dropped_row');
  t.same(atDropped?.path, ['candidates', 1, 'residuals', 4]);
  const missing = refuse([null, ...e.slice(1)]);
  t.equal(missing?.code, 'residual_missing');
});

t.test('an observation count that differs from the rows used is refused, naming both', async (t) => {
  const out = compareModels(input([
    { form: 'fit', name: 'here', terms: ['x'], intercept: true },
    { form: 'rss', name: 'elsewhere', rss: 1.2, parameters: 3, observations: 13 },
  ]));
  t.ok('issues' in out);
  if ('issues' in out) {
    t.equal(out.issues[0].code, 'observations_mismatch');
    t.same(out.issues[0].path, ['candidates', 1, 'observations']);
    t.match(out.issues[0].message, /13 observations.*number 12/);
  }
});

t.test('likelihood candidates alone need no data; their counts must agree', async (t) => {
  const ok = run({
    columns: null, response: null, weights: null, policy: DEFAULT_POLICY, policyHash: 'x',
    candidates: [
      { form: 'logLikelihood', name: 'a', logLikelihood: -120.5, parameters: 4, observations: 80, estimation: 'ml' },
      { form: 'logLikelihood', name: 'b', logLikelihood: -118.2, parameters: 6, observations: 80, estimation: 'ml' },
    ],
  });
  t.equal(ok.dataset.fingerprint, null);
  t.ok(ok.cautions.some((c) => c.code === 'no_data'));
  // AIC: a = 249, b = 248.4 → b best by 0.6 (computed by hand).
  t.equal(ok.rankings.aic[0].name, 'b');
  t.ok(Math.abs(ok.rankings.aic[1].delta! - 0.6) < 1e-9);
  const bad = compareModels({
    columns: null, response: null, weights: null, policy: DEFAULT_POLICY, policyHash: 'x',
    candidates: [
      { form: 'logLikelihood', name: 'a', logLikelihood: -120.5, parameters: 4, observations: 80, estimation: 'ml' },
      { form: 'logLikelihood', name: 'b', logLikelihood: -118.2, parameters: 6, observations: 79, estimation: 'ml' },
    ],
  });
  t.ok('issues' in bad && bad.issues[0].code === 'observations_mismatch' && /79 observations.*"a" states 80/.test(bad.issues[0].message));
});

t.test('REML likelihoods: never mixed with ML, and only with the same fixed effects', async (t) => {
  const reml = (name: string, fixedEffects?: string[]): CandidateInput => ({ form: 'logLikelihood', name, logLikelihood: -50, parameters: 5, observations: 40, estimation: 'reml', fixedEffects });
  const ml: CandidateInput = { form: 'logLikelihood', name: 'ml', logLikelihood: -49, parameters: 5, observations: 40, estimation: 'ml' };
  const noData = { columns: null, response: null, weights: null, policy: DEFAULT_POLICY, policyHash: 'x' };
  const code = (candidates: CandidateInput[]) => { const r = compareModels({ ...noData, candidates }); return 'issues' in r ? r.issues.map((i) => i.code) : []; };
  t.same(code([reml('r1', ['temp']), ml]), ['estimation_mixed']);
  t.same(code([reml('r1', ['temp', 'kiln']), reml('r2', ['kiln'])]), ['reml_fixed_effects_differ']);
  t.same(code([reml('r1'), reml('r2', ['kiln'])]), ['reml_fixed_effects_missing']);
  t.same(code([reml('r1', ['temp', 'kiln']), reml('r2', ['kiln', 'temp'])]), [], 'the same set in another order compares');
});

t.test('log-normal data: the log model\'s likelihood carries the Jacobian and outranks the model of y', async (t) => {
  // Data: y = exp(0.5 + 0.3 x + ε) with fixed ε — a log-normal response.
  const eps = [0.12, -0.31, 0.25, -0.08, 0.4, -0.22, 0.05, -0.36, 0.18, 0.29, -0.15, 0.02, -0.27, 0.33, -0.04, 0.21];
  const xs = eps.map((_, i) => i + 1);
  const ys = xs.map((v, i) => Math.exp(0.5 + 0.3 * v + eps[i]));
  const r = run({
    columns: { y: ys, x: xs }, response: 'y', weights: null, policy: DEFAULT_POLICY, policyHash: 'x',
    candidates: [
      { form: 'fit', name: 'linear', terms: ['x'], intercept: true },
      { form: 'fit', name: 'log-linear', terms: ['x'], intercept: true, response: { fn: 'log' } },
    ],
  });
  const logModel = r.models.find((m) => m.name === 'log-linear')!;
  // By hand: fit log y on x, then Σ lognormal logpdf(y; μ̂ᵢ, σ̂) with σ̂² = RSS/n.
  const ly = ys.map(Math.log);
  const e = lineResiduals(xs, ly);
  const sigma = Math.sqrt(e.reduce((s, v) => s + v * v, 0) / e.length);
  const byHand = ys.reduce((s, v, i) => s + lognormalLogpdf(v, ly[i] - e[i], sigma), 0);
  t.ok(rel(logModel.logLikelihood!, byHand) < 1e-11, `${logModel.logLikelihood} vs ${byHand}`);
  t.ok(Math.abs(logModel.responseTransform!.jacobian + ly.reduce((a, b) => a + b)) < 1e-12, 'jacobian = −Σ ln y');
  t.equal(r.rankings.aicc[0].name, 'log-linear');
  t.ok(logModel.cautions.some((c) => c.code === 'transformed_response'));
  t.ok(r.cautions.some((c) => c.code === 'adjusted_r2_mixed_scales'));
});

t.test('sqrt and Box–Cox Jacobians: sqrt −Σ ln(2√y), Box–Cox (λ−1) Σ ln y, and λ = 0 is the log', async (t) => {
  const pos = y.map((v) => v + 1);
  const base = { columns: { y: pos, x }, response: 'y', weights: null, policy: DEFAULT_POLICY, policyHash: 'x' } as const;
  const r = run({ ...base, candidates: [
    { form: 'fit', name: 'sqrt', terms: ['x'], intercept: true, response: { fn: 'sqrt' } },
    { form: 'fit', name: 'bc', terms: ['x'], intercept: true, response: { fn: 'boxcox', lambda: 0.5 } },
    { form: 'fit', name: 'bc0', terms: ['x'], intercept: true, response: { fn: 'boxcox', lambda: 0 } },
    { form: 'fit', name: 'log', terms: ['x'], intercept: true, response: { fn: 'log' } },
  ] });
  const sumLog = pos.reduce((s, v) => s + Math.log(v), 0);
  const get = (n: string) => r.models.find((m) => m.name === n)!;
  t.ok(Math.abs(get('sqrt').responseTransform!.jacobian + pos.reduce((s, v) => s + Math.log(2 * Math.sqrt(v)), 0)) < 1e-11);
  t.ok(Math.abs(get('bc').responseTransform!.jacobian - (0.5 - 1) * sumLog) < 1e-11);
  t.ok(rel(get('bc0').logLikelihood!, get('log').logLikelihood!) < 1e-12, 'Box–Cox at λ = 0 is the log model');
  // (y^½ − 1)/½ = 2√y − 2 is an affine map of √y: the same model, so the same likelihood.
  t.ok(rel(get('bc').logLikelihood!, get('sqrt').logLikelihood!) < 1e-11, 'Box–Cox ½ and sqrt describe the same model');
});

t.test('a transform outside its domain names the first offending row', async (t) => {
  const out = compareModels({ ...input([{ form: 'fit', name: 'log', terms: ['x'], intercept: true, response: { fn: 'log' } }]), columns: { y: y.map((v, i) => (i === 3 ? -1 : v)), x } });
  t.ok('issues' in out && out.issues[0].code === 'response_transform_domain');
  if ('issues' in out) t.same(out.issues[0].path, ['candidates', 0, 'response']);
});
