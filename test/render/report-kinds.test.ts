// The report of comparisons beyond least squares, built by POSTing through the
// app: a generalised linear comparison with QAIC, life distributions on
// censored data with percentiles, and a nonlinear mean function. Each report
// names every model's kind, its distribution's own parameters and how its fit
// converged, as the stored record has them; a least-squares record has none
// of these parts. The numbers asserted are the record's own, printed in the
// report's number style (the fits themselves are checked against R, scipy and
// NIST in test/http/glm-comparisons, lifetime and nonlinear-comparisons).
import { readFileSync } from 'node:fs';
import t, { type Test } from 'tap';
import { formatFixed, formatPercent, formatSignificant } from '../../src/render/number-format.ts';
import { buildTestApp } from '../helper.ts';
import { referenceCase } from '../core/models/glm/reference-data.ts';
import { solderJoints, SOLDER_TERMS } from '../core/models/lifetime/fixtures.ts';
import { kilnRecord } from './fixture-record.ts';
import { renderReportHtml } from '../../src/render/report-html.ts';
import { summariseHtml } from './parse-with-python.ts';

type App = Awaited<ReturnType<typeof buildTestApp>>['app'];

async function postAndReport(t: Test, app: App, payload: object) {
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload });
  t.equal(res.statusCode, 200, res.statusCode === 200 ? 'answered' : res.body.slice(0, 400));
  const body = res.json();
  const report = await app.inject({ method: 'GET', url: `/v1/comparisons/${body.id}/report` });
  t.equal(report.statusCode, 200, 'the report');
  return { body, html: report.body, page: summariseHtml(report.body) };
}

const rowsOf = (page: ReturnType<typeof summariseHtml>, table: string) => page.rows.filter((r) => r.table === table);

t.test('a generalised linear comparison: family and link, θ ± SE, convergence, deviance and the QAIC ranking', async (t) => {
  const { app } = await buildTestApp(t);
  const seams = referenceCase('seams-poisson-offset');
  const valves = referenceCase('valves-negative-binomial');
  const { body, page } = await postAndReport(t, app, {
    data: { columns: valves.data }, response: valves.response,
    candidates: [
      { name: 'negbin', terms: valves.terms, family: 'negativeBinomial', link: valves.link },
      { name: 'poisson', terms: valves.terms, family: 'poisson' },
    ],
  });
  const kinds = rowsOf(page, 'model-kinds');
  t.same(kinds.map((r) => r.model), ['negbin', 'poisson']);
  t.equal(kinds[0].cells[1], `generalised linear: negativeBinomial, ${valves.link} link`);
  t.equal(kinds[1].cells[1], 'generalised linear: poisson, log link');
  const theta = body.models[0].distributionParameters[0];
  t.equal(kinds[0].cells[2], `${theta.name} = ${formatSignificant(theta.estimate)} ± ${formatSignificant(theta.standardError)}`);
  t.equal(kinds[1].cells[2], '', 'the Poisson has no parameter of its own');
  t.equal(kinds[0].cells[3], `converged after ${body.models[0].convergence.iterations} iterations`);
  t.equal(kinds[0].cells[4], formatSignificant(body.models[0].deviance));
  t.equal(kinds[0].cells[5], formatPercent(body.models[0].devianceExplained));
  t.match(page.text, /k counts every estimated parameter/);

  const quasi = await postAndReport(t, app, {
    data: { columns: seams.data }, response: seams.response,
    candidates: [{ name: 'full', terms: seams.terms, family: 'poisson', offset: 'logLength' }, { name: 'current', terms: ['current'], family: 'poisson', offset: 'logLength' }],
    options: { overdispersion: { cHat: 'estimate' } },
  });
  const qaic = rowsOf(quasi.page, 'qaic');
  t.same(qaic.map((r) => r.model), quasi.body.rankings.qaic.map((e: { name: string }) => e.name), 'the QAIC ranking in its order');
  t.equal(qaic[0].cells[4], 'best');
  t.equal(rowsOf(quasi.page, 'qaicc').length, 2);
  // The GLM columns of the kinds table: null deviance and Pearson χ² as R's glm has them
  // (test/reference/glm: R's glm, versions in the file), QAIC by hand: −2 logL/ĉ + 2k, k counting ĉ.
  const full = quasi.body.models[0];
  t.ok(Math.abs(full.nullDeviance - seams.nullDeviance) < 1e-8 * seams.nullDeviance, 'null deviance as R');
  t.ok(Math.abs(full.pearsonChiSquare - seams.pearsonChiSquare) < 1e-8 * seams.pearsonChiSquare, 'Pearson χ² as R');
  const cHat = quasi.body.overdispersion.cHat;
  const qaicFull = (-2 * seams.logLikelihood) / cHat + 2 * (seams.parameters + 1);
  t.ok(Math.abs(full.qaic - qaicFull) < 1e-9, 'QAIC by hand from R\'s log-likelihood');
  const seamKinds = rowsOf(quasi.page, 'model-kinds');
  t.same(seamKinds[0].cells.slice(3), [
    formatSignificant(full.deviance), formatPercent(full.devianceExplained), formatSignificant(full.nullDeviance),
    formatSignificant(full.pearsonChiSquare), formatFixed(full.qaic, 3), formatFixed(full.qaicc, 3),
  ], 'deviance, deviance explained, null deviance, Pearson χ², QAIC, QAICc');
  t.match(quasi.page.text, /Pearson χ²: Σ \(y − μ\)² \/ V\(μ\)/);
  t.equal(kinds[0].cells.length, 8, 'without a ĉ: model, kind, θ, fit, deviance, explained, null deviance, Pearson χ²');
  t.match(quasi.page.text, new RegExp(`QAIC and QAICc use ĉ = ${formatSignificant(quasi.body.overdispersion.cHat, 'n/a', 4)}, estimated as Pearson χ² / residual degrees of freedom of full`));
});

t.test('life distributions: the distribution, its parameters, convergence, censoring counts and percentiles', async (t) => {
  const { app } = await buildTestApp(t);
  const { body, page, html } = await postAndReport(t, app, {
    data: { columns: solderJoints() }, response: 'cycles', censoring: { status: 'status', upper: 'upper' },
    candidates: [
      { name: 'weibull-arrhenius', distribution: 'weibull', terms: SOLDER_TERMS },
      { name: 'weibull-alone', distribution: 'weibull' },
    ],
    options: { percentiles: [0.1, 0.5] },
  });
  const kinds = rowsOf(page, 'model-kinds');
  t.equal(kinds[0].cells[1], 'life distribution: weibull');
  const alone = body.models[1];
  t.ok(alone.distributionParameters.length >= 2, 'shape and scale for a model without terms');
  for (const p of alone.distributionParameters) t.ok(kinds[1].cells[2].includes(`${p.name} = ${formatSignificant(p.estimate)} ± ${formatSignificant(p.standardError)}`), p.name);
  t.match(kinds[1].cells[3], new RegExp(`^converged after ${alone.convergence.iterations} iterations?$`));
  const c = alone.censoring;
  t.ok(c.right + c.left + c.interval > 0, 'the data are censored');
  t.match(page.text, new RegExp(`The life models were fitted to ${c.exact} exact failures, ${c.right} right-censored, ${c.left} left-censored, ${c.interval} interval-censored\\.`));
  const percentiles = rowsOf(page, 'percentiles');
  t.same(percentiles.map((r) => r.model), ['weibull-alone', 'weibull-alone'], 'only the model without terms has percentiles');
  t.same(percentiles.map((r) => r.cells.slice(1)), alone.percentiles.map((q: Record<string, number>) =>
    [formatPercent(q.probability), formatSignificant(q.estimate), formatSignificant(q.lower), formatSignificant(q.upper)]));
  t.ok(html.includes('data-section="censoring"'));
  t.match(page.text, new RegExp(`with its ${Math.round(body.conventions.intervalLevel * 100)}% interval`), 'the percentiles name their interval level');
  t.equal(rowsOf(page, 'model-fit').length, 0, 'no table of residual sums for life models, which have none');
});

t.test('a nonlinear mean function: its expression and how its starts converged', async (t) => {
  const { app } = await buildTestApp(t);
  const r = JSON.parse(readFileSync(new URL('../reference/nonlinear/kiln-drying-r.json', import.meta.url), 'utf8'));
  const { body, page } = await postAndReport(t, app, {
    data: { columns: { hours: r.data.hours, moisture: r.data.moisture } }, response: 'moisture',
    candidates: [
      { name: 'equilibrium', expression: 'eq + (m0 - eq)*exp(-k*hours)', start: { eq: 5, m0: 40, k: 0.03 } },
      { name: 'quadratic', terms: ['hours', { kind: 'power', of: 'hours', degree: 2 }] },
    ],
  });
  const kinds = rowsOf(page, 'model-kinds');
  t.equal(kinds[0].cells[1], 'nonlinear: eq + (m0 - eq)*exp(-k*hours)');
  t.equal(kinds[1].cells[1], 'least squares');
  t.equal(kinds[0].cells[2], `converged after ${body.models[0].convergence.iterations} iterations`);
  t.equal(kinds[1].cells[2], '', 'least squares has no iterations');
});

t.test('a least-squares record has none of these parts', async (t) => {
  const html = renderReportHtml(kilnRecord());
  for (const part of ['model-kinds', 'data-section="censoring"', 'percentiles', 'data-ranking="qaic"', 'data-section="overdispersion"']) t.notOk(html.includes(part), part);
});
