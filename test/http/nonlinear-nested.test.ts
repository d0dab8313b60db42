// Nested tests of pairs with an expression, named in options.tests, through
// POST /v1/comparisons: the extra-sum-of-squares F test against R 4.2's
// anova() (test/reference/nonlinear/r-nls.json, made by
// scripts/nonlinear-r-fixtures.R, R version in the file) for a nonlinear pair,
// a nonlinear model inside a linear one, and a linear model inside one linear
// in its parameters but written as an expression. Nesting of such a pair is
// taken on the caller's word, and each test says so.
import { readFileSync } from 'node:fs';
import t, { type Test } from 'tap';
import { buildTestApp } from '../helper.ts';

// A nonlinear fit is priced at its iteration cap, which puts even a small one
// above COMPUTE_INLINE_WORK (price-candidate.ts); these tests check numbers,
// not where they are computed (limits/nonlinear-inline-and-pool does that), so
// they compute on the main thread rather than start a worker pool per app.
const ON_MAIN_THREAD = { computeInlineWork: 1e12 };

const r = JSON.parse(readFileSync(new URL('../reference/nonlinear/r-nls.json', import.meta.url), 'utf8'));
const mixed = r.mixedPairs;
const candidates = [
  { name: 'larger', expression: r.fits.larger.expression, start: r.fits.larger.start },
  { name: 'smaller', expression: r.fits.smaller.expression, start: r.fits.smaller.start },
  { name: 'vertex', ...mixed.vertex },
  { name: 'quadratic', terms: ['hours', { kind: 'power', of: 'hours', degree: 2 }] },
  { name: 'line', terms: ['hours'] },
  { name: 'quadratic-expression', ...mixed['quadratic-expression'] },
];
const request = (tests: { smaller: string; larger: string }[], extra: object[] = []) => ({
  data: { columns: { hours: r.data.hours, moisture: r.data.moisture } },
  response: 'moisture',
  candidates: [...candidates, ...extra],
  options: { tests },
});

interface Reference { smaller: string; larger: string; df: number; residualDf: number; F: number; p: number }
const references: Reference[] = [{ smaller: 'smaller', larger: 'larger', ...r.anova }, ...mixed.anova];

async function post(t: Test, payload: object) {
  const { app } = await buildTestApp(t, ON_MAIN_THREAD);
  return app.inject({ method: 'POST', url: '/v1/comparisons', payload });
}

t.test('named pairs with an expression are tested, as R\'s anova() tests them', async (t) => {
  const res = await post(t, request(references.map(({ smaller, larger }) => ({ smaller, larger }))));
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const tests = res.json().nestedTests as { smaller: string; larger: string; df: number; residualDf: number; fStatistic: number; fPValue: number; lrStatistic: number; reason: string | null }[];
  for (const ref of references) {
    const found = tests.filter((x) => x.smaller === ref.smaller && x.larger === ref.larger);
    t.equal(found.length, 1, `${ref.smaller} inside ${ref.larger}: tested once`);
    const [test] = found;
    t.equal(test.df, ref.df, 'df (R anova)');
    t.equal(test.residualDf, ref.residualDf, 'residual df (R anova)');
    t.ok(Math.abs(test.fStatistic - ref.F) <= 1e-7 * ref.F, `F ${test.fStatistic} (R ${ref.F})`);
    t.ok(Math.abs(test.fPValue - ref.p) <= 1e-5 * ref.p, `p ${test.fPValue} (R ${ref.p})`);
    t.match(test.reason, /caller's word/, 'says the nesting was not checked');
  }
  const models = Object.fromEntries(res.json().models.map((m: { name: string; logLikelihood: number }) => [m.name, m.logLikelihood]));
  const vertex = tests.find((x) => x.smaller === 'vertex')!;
  t.ok(Math.abs(vertex.lrStatistic - 2 * (models.quadratic - models.vertex)) <= 1e-9 * vertex.lrStatistic, 'LR = 2 (logL_l − logL_s), one convention across kinds');
  // Two linear designs are still nested by their columns, found without asking, and say nothing about the caller's word.
  const byColumns = tests.find((x) => x.smaller === 'line' && x.larger === 'quadratic');
  t.ok(byColumns, 'line inside quadratic found by column keys');
  t.equal(byColumns!.reason, null);
  // The linear model written as an expression is the linear quadratic (same sample, same RSS): R's lm deviance.
  const rssOf = (name: string) => res.json().models.find((m: { name: string }) => m.name === name).rss;
  t.ok(Math.abs(rssOf('quadratic-expression') - mixed.anova[1].rss[1]) <= 1e-9 * mixed.anova[1].rss[1], 'expression RSS = lm deviance');
  t.ok(Math.abs(rssOf('quadratic') - mixed.anova[0].rss[1]) <= 1e-9 * mixed.anova[0].rss[1], 'linear RSS = lm deviance');
});

t.test('a named pair the checks refute is a 422 at options/tests/i', async (t) => {
  const swapped = await post(t, request([{ smaller: 'smaller', larger: 'larger' }, { smaller: 'quadratic', larger: 'vertex' }]));
  t.equal(swapped.statusCode, 422, swapped.body.slice(0, 300));
  t.match(swapped.json().errors, [{ path: 'options/tests/1', code: 'nested_test_invalid' }]);
  t.match(swapped.json().errors[0].message, /the larger model of a nested pair has more/);
  // A model of log moisture is not fitted to the same sample as one of moisture.
  const logScale = { name: 'log-decay', expression: 'a - k*hours', start: { a: 3.7, k: 0.01 }, response: { fn: 'log' } };
  const scales = await post(t, request([{ smaller: 'log-decay', larger: 'larger' }], [logScale]));
  t.equal(scales.statusCode, 422, scales.body.slice(0, 300));
  t.match(scales.json().errors[0], { path: 'options/tests/0', code: 'nested_test_invalid' });
  t.match(scales.json().errors[0].message, /same response, weights and rows/);
  const unknown = await post(t, request([{ smaller: 'vertex', larger: 'cubic' }]));
  t.equal(unknown.statusCode, 422);
  t.match(unknown.json().errors[0], { path: 'options/tests/0', code: 'nested_test_invalid' });
});
