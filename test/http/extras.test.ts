// Nested tests, leave-one-out, diagnostics, predictions and averaging as the
// comparison response carries them (the statistics themselves are checked
// against their sources under test/core/).
import { readFileSync } from 'node:fs';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';
import { buildDesign } from '../../src/core/design/index.ts';
import { fitLeastSquares } from '../../src/core/fit/index.ts';
import type { Term } from '../../src/core/types.ts';

const nist = (name: string) => JSON.parse(readFileSync(new URL(`../reference/nist/${name}.json`, import.meta.url), 'utf8'));

t.test('NIST Pontius: the nested F test of intercept-only against the quadratic is the certified ANOVA F', async (t) => {
  // Source: NIST StRD Pontius, certified regression F statistic (ANOVA table).
  const d = nist('pontius');
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: { y: d.data.y, x: d.data.x } }, response: 'y',
      candidates: [{ name: 'mean', terms: [] }, { name: 'quadratic', terms: ['x', { kind: 'power', of: 'x', degree: 2 }] }],
    },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const [test] = res.json().nestedTests;
  t.match(test, { smaller: 'mean', larger: 'quadratic', df: 2, residualDf: 37 });
  const certified = Number(d.certified.anova.regression.F);
  t.ok(Math.abs(test.fStatistic - certified) / certified < 1e-9, `F ${test.fStatistic} vs certified ${certified}`);
  t.ok(test.fPValue >= 0 && test.fPValue < 1e-100, 'a tiny upper tail, not 0 from 1 − cdf');
});

t.test('the demo comparison carries nested tests, leave-one-out, diagnostics and an average', async (t) => {
  const { app } = await buildTestApp(t);
  const request = demoComparison();
  const body = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request })).json();
  const pairs = body.nestedTests.map((p: { smaller: string; larger: string }) => `${p.smaller} < ${p.larger}`);
  t.ok(pairs.includes('temperature < curved-temperature'));
  t.ok(pairs.includes('curve+moisture+kiln < curve+moisture+kiln+hold'));
  t.notOk(pairs.some((p: string) => p.startsWith('curved-temperature < temperature')), 'oriented smaller < larger');
  t.equal(body.rankings.loo.length, 5);
  t.ok(body.rankings.loo.every((e: { weight: null }) => e.weight === null), 'no weights over leave-one-out');
  for (const m of body.models) {
    t.type(m.press, 'number');
    t.ok(Math.abs(m.looRmse - Math.sqrt(m.press / 116)) < 1e-12, 'looRmse = sqrt(press/n)');
    t.equal(m.diagnostics.residualNormality.test, 'Jarque–Bera');
    t.match(m.diagnostics.autocorrelation.note, /time/);
  }
  t.equal(body.averaged.criterion, 'aicc');
  const weightSum = body.rankings.aicc.reduce((s: number, e: { weight: number }) => s + e.weight, 0);
  t.ok(Math.abs(weightSum - 1) < 1e-12);
  const moisture = body.averaged.terms.find((x: { term: string }) => x.term === 'moisture');
  t.ok(moisture.importance > 0.99, 'moisture is in every model that carries weight');
  const hold = body.averaged.terms.find((x: { term: string }) => x.term === 'holdMinutes');
  t.ok(hold.importance < 0.6, 'hold time (no effect in the generating model) has less importance');

  // PRESS by brute force: refit without each row (definition of leave-one-out).
  const model = body.models.find((m: { name: string }) => m.name === 'curve+moisture+kiln');
  const cols = request.data.columns as Record<string, (number | string | null)[]>;
  const rows = cols.shrinkage.map((_, i) => i).filter((i) => Object.values(cols).every((c) => c[i] !== null));
  const terms = request.candidates[2].terms as Term[];
  const all = (buildDesign(cols, terms, true, rows) as { design: { high: Float64Array[]; low: Float64Array[] } }).design;
  let press = 0;
  rows.forEach((out, i) => {
    const keep = rows.filter((r) => r !== out);
    const built = buildDesign(cols, terms, true, keep);
    const fit = fitLeastSquares((built as { design: never }).design, Float64Array.from(keep.map((r) => cols.shrinkage[r] as number)));
    const yhat = fit.coefficients.reduce((s: number, b, j) => s + (b ?? 0) * (all.high[j][i] + all.low[j][i]), 0);
    press += ((cols.shrinkage[out] as number) - yhat) ** 2;
  });
  t.ok(Math.abs(model.press - press) / press < 1e-9, `PRESS ${model.press} vs ${rows.length} refits ${press}`);
});

t.test('predictions at new rows, per model and averaged; new rows are validated like data', async (t) => {
  const { app } = await buildTestApp(t);
  const predict = { columns: { peakTemp: [1190, 1230], holdMinutes: [30, 45], moisture: [5.5, 7.0], kiln: ['east', 'west'] } };
  const body = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), options: { predict } } })).json();
  for (const m of body.models) t.equal(m.predictions.length, 2, `${m.name}: one prediction per row`);
  // The generating model (scripts/demo-data.ts) gives 7.2 + 0.018·(−10) − 0.00012·100 + 0.35·(−0.5) = 6.833 at the first row.
  const truth = body.models.find((m: { name: string }) => m.name === 'curve+moisture+kiln').predictions[0];
  t.ok(Math.abs(truth.estimate - 6.833) < 4 * truth.standardError + 0.05, `${truth.estimate} ± ${truth.standardError}`);
  t.equal(body.averaged.predictions.length, 2);

  const unknownLevel = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), options: { predict: { columns: { ...predict.columns, kiln: ['north', 'west'] } } } } });
  t.equal(unknownLevel.statusCode, 422);
  // An unseen level in the prediction rows is a level the models were not fitted on, not a "reference level".
  t.match(unknownLevel.json().errors[0], { path: 'options/predict/columns/kiln/0', code: 'prediction_level_unknown', level: 'north', levels: ['east', 'west'] });
  t.match(unknownLevel.json().errors[0].message, /level "north" of column "kiln", which the rows the models were fitted on do not have/);
  t.notMatch(unknownLevel.json().errors[0].message, /reference/);
  const { moisture: _dropped, ...withoutMoisture } = predict.columns;
  const missing = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), options: { predict: { columns: withoutMoisture } } } });
  t.equal(missing.statusCode, 422);
  // The prediction rows lack the column, not the data.
  t.match(missing.json().errors[0], { path: 'options/predict/columns', code: 'prediction_column_missing', column: 'moisture' });
  t.match(missing.json().errors[0].message, /^options\/predict\/columns lacks column "moisture", which a fitted candidate uses/);
  t.notMatch(missing.json().errors[0].message, /data does not have/);
});

t.test('a requested pair that is not nested is a 422 at options/tests', async (t) => {
  const { app } = await buildTestApp(t);
  const request = demoComparison();
  const candidates = [...request.candidates, { name: 'moisture-only', terms: ['moisture'] }];
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...request, candidates, options: { tests: [{ smaller: 'moisture-only', larger: 'curved-temperature' }] } } });
  t.equal(res.statusCode, 422);
  t.match(res.json().errors[0], { path: 'options/tests/0', code: 'nested_test_invalid' });
});

t.test('averaging over the confidence set leaves out models outside it, by name', async (t) => {
  const { app } = await buildTestApp(t);
  const body = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...demoComparison(), options: { average: 'confidenceSet' } } })).json();
  t.equal(body.averaged.over, 'confidenceSet');
  t.ok(body.averaged.excluded.some((e: { name: string; reason: string }) => e.name === 'temperature' && /confidence set/.test(e.reason)));
});
