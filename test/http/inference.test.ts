// Coefficient tests, prediction intervals, back-transformed and averaged
// predictions as the comparison response carries them, checked against
// statsmodels, scipy and numpy: test/reference/tables/inference-reference.json,
// made by scripts/make-inference-reference.py (its versions are in the file's
// generatedWith). CI does not run Python; the tests read the committed output.
import t, { type Test } from 'tap';
import reference from '../reference/tables/inference-reference.json' with { type: 'json' };
import nistLongley from '../reference/nist/longley.json' with { type: 'json' };
import { buildTestApp } from '../helper.ts';

type Table = Record<string, number[]>;

/** Each value of `got` within `tol` (relative, with an absolute floor for values near 0) of statsmodels'. */
function agrees(t: Test, got: Record<string, unknown>[], expected: Table, fields: string[], tol: number, what: string) {
  for (const field of fields) {
    expected[field].forEach((want, i) => {
      const value = got[i][field] as number;
      const scale = Math.max(Math.abs(want), field === 'pValue' ? 0 : 1e-300);
      t.ok(typeof value === 'number' && Math.abs(value - want) <= tol * scale + (field === 'pValue' ? 1e-15 : 0),
        `${what} ${field}[${i}]: ${value} vs statsmodels ${want}`);
    });
  }
}

const COEFFICIENT_FIELDS = ['estimate', 'standardError', 'tStatistic', 'pValue', 'lower', 'upper'];
const PREDICTION_FIELDS = ['estimate', 'standardError', 'lower', 'upper', 'predictionLower', 'predictionUpper'];

async function compare(t: Test, payload: object) {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 200, res.body.slice(0, 400));
  return res.json();
}

t.test('Longley (NIST data): t statistics, p-values and intervals agree with statsmodels OLS at 95% and 90%', async (t) => {
  const L = reference.longley;
  const columns = { y: nistLongley.data.y, ...Object.fromEntries(L.columns.map((c) => [c, (nistLongley.data as Record<string, number[]>)[c]])) };
  const candidate = { name: 'all six', terms: L.columns };
  const body = await compare(t, { data: { columns }, response: 'y', candidates: [candidate, { name: 'mean', terms: [] }], options: { predict: { columns: L.newRows } } });
  const model = body.models[0];
  // Longley is ill-conditioned: statsmodels (pinv in doubles) and the service
  // (QR with refinement) agree to about 1e-8 in the estimates.
  agrees(t, model.coefficients, L.coefficients95, COEFFICIENT_FIELDS, 2e-7, 'Longley 95%');
  agrees(t, model.predictions, L.predictions95, PREDICTION_FIELDS, 2e-8, 'Longley prediction');
  t.equal(body.conventions.intervalLevel, 0.95);
  t.match(body.conventions.inference, /Student's t with n − p degrees of freedom/);
  const ninety = await compare(t, { data: { columns }, response: 'y', candidates: [candidate], options: { intervalLevel: 0.9 } });
  agrees(t, ninety.models[0].coefficients, L.coefficients90, ['lower', 'upper'], 2e-7, 'Longley 90%');
  t.equal(ninety.conventions.intervalLevel, 0.9);
  // A model of y itself: predictions are not back-transformed.
  t.equal(model.predictionScale.backTransform, 'none');
});

t.test('weighted least squares (seeded coating data): coefficients and intervals agree with statsmodels WLS', async (t) => {
  const C = reference.coating;
  const request = { data: { columns: C.data }, response: 'thickness', weights: 'readings', candidates: [{ name: 'speed+pressure', terms: ['speed', 'pressure'] }, { name: 'speed', terms: ['speed'] }] };
  const body = await compare(t, { ...request, options: { predict: { columns: C.newRows } } });
  agrees(t, body.models[0].coefficients, C.coefficients95, COEFFICIENT_FIELDS, 1e-10, 'WLS');
  // A new observation of weight 1 (statsmodels' default for new rows).
  agrees(t, body.models[0].predictions, C.predictions95, PREDICTION_FIELDS, 1e-10, "WLS prediction, weight 1");
  // The prediction rows may carry the weights column: the new observations' own weights.
  const weighted = await compare(t, { ...request, options: { predict: { columns: { ...C.newRows, readings: C.newRowWeights } } } });
  agrees(t, weighted.models[0].predictions, C.predictions95Weighted, PREDICTION_FIELDS, 1e-10, 'WLS prediction, given weights');
  t.match(body.conventions.predictions, /new observation of weight w₀ — 1, or its value in the weights column/);
});

t.test('from a data summary (numpy moments of the same rows): the same coefficient tests and intervals', async (t) => {
  const C = reference.coating;
  const body = await compare(t, {
    data: { summary: C.summary }, response: 'thickness',
    candidates: [{ name: 'speed+pressure', terms: ['speed', 'pressure'] }, { name: 'speed', terms: ['speed'] }],
    options: { predict: { columns: C.newRows } },
  });
  // The normal equations lose some digits against QR on the rows.
  agrees(t, body.models[0].coefficients, C.coefficients95, COEFFICIENT_FIELDS, 1e-8, 'summary');
  agrees(t, body.models[0].predictions, C.predictions95, PREDICTION_FIELDS, 1e-8, 'summary prediction');
  t.ok(body.averaged, 'averaging works from a summary too');
  t.same(body.averaged.models, ['speed+pressure', 'speed']);
  t.equal(body.averaged.predictions.length, 2);
});

/** The fatigue data: a straight line in crack length against one in log length, predicted at three loads. */
const fatigueRequest = {
  data: { columns: reference.fatigue.data }, response: 'length',
  candidates: [{ name: 'line', terms: ['load'] }, { name: 'log-line', terms: ['load'], response: { fn: 'log' } }],
  options: { predict: { columns: reference.fatigue.newRows } },
};

t.test('a model of log y predicts on the original scale: exp of the statsmodels log-scale frame, marked as the median', async (t) => {
  const F = reference.fatigue;
  const body = await compare(t, fatigueRequest);
  const [line, logLine] = body.models;
  agrees(t, line.coefficients, F.line.coefficients95, COEFFICIENT_FIELDS, 1e-10, 'line');
  agrees(t, line.predictions, F.line.predictions95, PREDICTION_FIELDS, 1e-10, 'line prediction');
  // Coefficients of the log model are on the log scale, as fitted.
  agrees(t, logLine.coefficients, F.logLine.coefficients95, COEFFICIENT_FIELDS, 1e-10, 'log-line');
  agrees(t, logLine.predictions, F.logLine.backTransformed95, PREDICTION_FIELDS, 1e-10, 'log-line back-transformed');
  t.same(logLine.predictionScale.backTransform, 'median');
  t.match(logLine.predictionScale.description, /exp\(μ̂\)/);
  t.ok(Math.abs(logLine.logLikelihood - F.logLine.logLikelihood) < 1e-10 * Math.abs(F.logLine.logLikelihood), 'log-likelihood with the Jacobian');
});

t.test('model averaging keeps the winner: predictions over both scales, MATA intervals as scipy solves them', async (t) => {
  const F = reference.fatigue;
  const body = await compare(t, fatigueRequest);
  const weights = Object.fromEntries(body.rankings.aicc.map((e: { name: string; weight: number }) => [e.name, e.weight]));
  t.ok(Math.abs(weights['log-line'] - F.aiccWeights['log-line']) < 1e-10, `AICc weight ${weights['log-line']} vs ${F.aiccWeights['log-line']}`);
  const averaged = body.averaged;
  // Coefficients: one scale only, the one holding most weight (log, 0.86); said with a caution.
  t.same(averaged.models, ['log-line']);
  t.same(averaged.responseTransform, { fn: 'log' });
  t.ok(Math.abs(averaged.weightCovered - F.aiccWeights['log-line']) < 1e-12);
  t.match(averaged.excluded, [{ name: 'line', reason: /describes the response as sent, while the averaged coefficients are of log\(response\)/ }]);
  t.ok(body.cautions.some((c: { code: string }) => c.code === 'averaged_coefficients_partial'), 'a caution when weightCovered < 1');
  // Predictions: both models, on the original scale.
  t.same(averaged.predictionsOver.models, ['line', 'log-line']);
  t.ok(Math.abs(averaged.predictionsOver.weightCovered - 1) < 1e-12);
  t.notOk(body.cautions.some((c: { code: string }) => c.code === 'averaged_predictions_partial'));
  agrees(t, averaged.predictions, F.averaged95, ['estimate', 'standardError'], 1e-10, 'averaged');
  // The MATA bounds are roots found to ~1e-14 by scipy and by bisection here.
  agrees(t, averaged.predictions, F.averaged95, ['lower', 'upper', 'predictionLower', 'predictionUpper'], 1e-9, 'averaged MATA');
});
