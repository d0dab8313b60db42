// What comes after the ranking for generalised linear models, through POST
// /v1/comparisons, against R 4.2 (test/reference/glm/glm-reference.json, made
// by scripts/glm-reference.R; versions in the file): deviance tests found and
// asked for, predictions of the mean through the link, the family's checks,
// and averaging that keeps coefficients to one family and link while
// predictions are averaged over every model.
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { inlineAndPooled } from './limits/inline-and-pooled.ts';
import { REFERENCE, referenceCase, relativeError, worstRelativeError } from '../core/models/glm/reference-data.ts';

const seams = referenceCase('seams-poisson-offset');
const seamsTest = REFERENCE.tests['seams-poisson-lr'];

function seamsRequest(options: Record<string, unknown> = {}) {
  return {
    data: { columns: seams.data },
    response: 'defects',
    candidates: [
      { name: 'current', terms: ['current'], family: 'poisson', offset: 'logLength' },
      { name: 'current-gas', terms: ['current', 'gas'], family: 'poisson', offset: 'logLength' },
    ],
    options: {
      // The offset column travels with the new rows: the log of each seam's length.
      predict: { columns: { current: seams.prediction!.rows.current, gas: seams.prediction!.rows.gas, logLength: seams.prediction!.offset } },
      ...options,
    },
  };
}

t.test(`Poisson with an offset: deviance test, predictions and checks (${REFERENCE.generatedWith})`, async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: seamsRequest({ tests: [{ smaller: 'current', larger: 'current-gas' }] }) });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const body = res.json();
  t.equal(body.nestedTests.length, 1, 'found and asked for: reported once');
  const [test] = body.nestedTests;
  t.same([test.smaller, test.larger, test.df], ['current', 'current-gas', seamsTest.df]);
  t.ok(relativeError(test.lrStatistic, seamsTest.statistic) < 1e-9, `deviance difference ${test.lrStatistic} vs R anova ${seamsTest.statistic}`);
  t.ok(relativeError(test.lrPValue, seamsTest.pValue) < 1e-8, 'its χ² p-value');
  t.equal(test.fStatistic, null, 'the Poisson dispersion is fixed: no F test');
  t.match(test.reason, /dispersion is fixed/);

  const full = body.models.find((m: { name: string }) => m.name === 'current-gas');
  t.equal(full.predictionScale.backTransform, 'inverseLink');
  t.match(full.predictionScale.description, /link scale/);
  const p = full.predictions as { estimate: number; lower: number; upper: number; predictionLower: null }[];
  t.ok(worstRelativeError(p.map((x) => x.estimate), seams.prediction!.mean) < 1e-9, 'mean defects per seam (R predict.glm, linkinv)');
  t.ok(worstRelativeError(p.map((x) => x.lower), seams.prediction!.lower) < 1e-9, 'lower end mapped from the log scale');
  t.ok(worstRelativeError(p.map((x) => x.upper), seams.prediction!.upper) < 1e-9, 'upper end');
  t.ok(p.every((x) => x.predictionLower === null), 'no interval for a single new count');

  const glm = full.diagnostics.glm;
  t.ok(relativeError(glm.overdispersion.ratio, seams.pearsonChiSquare / 56) < 1e-10, 'Pearson χ²/df');
  t.ok(relativeError(glm.overdispersion.pValue, seams.pearsonPValue) < 1e-8, 'Pearson goodness-of-fit p (R pchisq)');
  t.ok(relativeError(full.diagnostics.influence.maxCooksDistance, Math.max(...seams.cooksDistances)) < 1e-8, 'largest Cook\'s distance (R cooks.distance)');
  t.equal(full.press, null);
  t.ok(full.cautions.some((c: { code: string; message: string }) => c.code === 'press_undefined' && /IRLS/.test(c.message)), 'why there is no leave-one-out');

  // Coefficients of two Poisson log-link models share a scale: both averaged.
  t.same(body.averaged.glm, { family: 'poisson', link: 'log' });
  t.same([...body.averaged.models].sort(), ['current', 'current-gas']);
  t.same(body.averaged.predictionsOver.models.sort(), ['current', 'current-gas']);
  t.equal(body.averaged.predictions.length, 3);
  // One model carries almost all the weight here: the average sits between the two models' predictions.
  const small = body.models.find((m: { name: string }) => m.name === 'current').predictions as { estimate: number }[];
  body.averaged.predictions.forEach((a: { estimate: number }, i: number) => {
    t.ok(a.estimate >= Math.min(p[i].estimate, small[i].estimate) - 1e-12 && a.estimate <= Math.max(p[i].estimate, small[i].estimate) + 1e-12, `row ${i} between the models`);
  });
});

t.test('prediction rows need the offset column, not the trials column', async (t) => {
  const { app } = await buildTestApp(t);
  const payload = seamsRequest();
  const { logLength: _, ...withoutOffset } = payload.options.predict.columns;
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...payload, options: { predict: { columns: withoutOffset } } } });
  t.equal(res.statusCode, 422);
  t.match(res.json().errors[0], { code: 'prediction_column_missing', path: 'options/predict/columns' });
  t.match(res.json().errors[0].detail ?? res.json().errors[0].message ?? '', /logLength/);

  const beetle = referenceCase('beetle-logit');
  const grouped = {
    data: { columns: beetle.data }, response: 'killed', trials: 'exposed',
    candidates: [{ name: 'logit', terms: ['dose'], family: 'binomial' }, { name: 'probit', terms: ['dose'], family: 'binomial', link: 'probit' }],
    options: { predict: { columns: { dose: beetle.prediction!.rows.dose } } },
  };
  const ok = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: grouped });
  t.equal(ok.statusCode, 200, ok.body.slice(0, 300));
  const logit = ok.json().models.find((m: { name: string }) => m.name === 'logit');
  t.ok(worstRelativeError(logit.predictions.map((x: { estimate: number }) => x.estimate), beetle.prediction!.mean) < 1e-9, 'probability of death per beetle (R)');
  t.ok(worstRelativeError(logit.predictions.map((x: { upper: number }) => x.upper), beetle.prediction!.upper) < 1e-9);
  t.ok(logit.predictions.every((x: { lower: number; upper: number }) => x.lower > 0 && x.upper < 1), 'inside (0, 1)');
  // Logit and probit: two links, so their coefficients are not averaged together; their predictions are.
  const averaged = ok.json().averaged;
  t.equal(averaged.models.length, 1);
  t.match(averaged.excluded, [{ reason: /probit link of a binomial mean|logit link of a binomial mean/ }]);
  t.same(averaged.predictionsOver.models.sort(), ['logit', 'probit']);
  t.equal(ok.json().nestedTests.length, 0, 'different links are never tested against each other');
});

t.test('averaging beside least squares: coefficients of one family and link, predictions of all', async (t) => {
  const { app } = await buildTestApp(t);
  const pumps = referenceCase('pumps-gamma-log');
  const payload = {
    data: { columns: pumps.data }, response: 'hours',
    candidates: [
      { name: 'gamma-log', terms: ['age', 'site'], family: 'gamma', link: 'log' },
      { name: 'gamma-log-age', terms: ['age'], family: 'gamma', link: 'log' },
      { name: 'gamma-inverse', terms: ['age', 'site'], family: 'gamma', link: 'inverse' },
      { name: 'least-squares', terms: ['age', 'site'] },
    ],
    options: { predict: { columns: pumps.prediction!.rows }, tests: [{ smaller: 'gamma-log-age', larger: 'gamma-log' }] },
  };
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  const body = res.json();
  const averaged = body.averaged;
  const groupOf = (name: string) => {
    const m = body.models.find((x: { name: string }) => x.name === name);
    return m.family ? `${m.family}/${m.link}` : 'least squares';
  };
  t.equal(new Set(averaged.models.map(groupOf)).size, 1, `coefficients of one family and link: ${averaged.models.join(', ')}`);
  t.equal(averaged.excluded.length, 4 - averaged.models.length, 'every other model excluded');
  t.ok(averaged.excluded.every((e: { reason: string }) => /predictions are averaged/.test(e.reason)), 'each with the reason, its predictions still averaged');
  t.same(averaged.predictionsOver.models.sort(), ['gamma-inverse', 'gamma-log', 'gamma-log-age', 'least-squares']);
  const f = REFERENCE.tests['pumps-gamma-f'];
  const test = body.nestedTests.find((x: { smaller: string }) => x.smaller === 'gamma-log-age');
  t.ok(relativeError(test.fStatistic, f.statistic) < 1e-9, `F ${test.fStatistic} vs R anova ${f.statistic}`);
  t.equal(test.residualDf, f.residualDf);
  t.equal(body.nestedTests.filter((x: { larger: string }) => x.larger === 'least-squares').length, 0, 'no test across kinds');

  const across = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: { ...payload, options: { tests: [{ smaller: 'gamma-log-age', larger: 'least-squares' }] } } });
  t.equal(across.statusCode, 422);
  t.match(across.json().errors[0], { path: 'options/tests/0', code: 'nested_test_invalid' });
});

t.test('the same after-ranking answer inline and on a worker of the pool', async (t) => {
  const { b } = await inlineAndPooled(t, seamsRequest({ tests: [{ smaller: 'current', larger: 'current-gas' }] }));
  t.equal(b.json().nestedTests.length, 1);
  t.ok(b.json().models.every((m: { diagnostics: { glm: unknown } }) => m.diagnostics.glm), 'the family checks travel back from the worker');
});

t.test('a GLM\'s mean beside a model of log y\'s median: averaged, with a note that says so', async (t) => {
  const { app } = await buildTestApp(t);
  const pumps = referenceCase('pumps-gamma-log');
  const res = await app.inject({
    method: 'POST', url: '/v1/comparisons',
    payload: {
      data: { columns: pumps.data }, response: 'hours',
      candidates: [{ name: 'gamma-log', terms: ['age', 'site'], family: 'gamma', link: 'log' }, { name: 'log-hours', terms: ['age', 'site'], response: { fn: 'log' } }],
      options: { predict: { columns: pumps.prediction!.rows } },
    },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const averaged = res.json().averaged;
  t.same(averaged.predictionsOver.models.sort(), ['gamma-log', 'log-hours']);
  t.ok(averaged.notes.some((n: string) => /mix medians .* with means/.test(n)));
  t.equal(averaged.models.length, 1, 'a log link and a log response: coefficients on different scales');
  const gamma = res.json().models.find((m: { name: string }) => m.name === 'gamma-log');
  t.ok(worstRelativeError(gamma.predictions.map((p: { estimate: number }) => p.estimate), pumps.prediction!.mean) < 1e-9, 'the gamma mean as R gives it');
});
