// The report as a reader meets it: conventions in words, one number style,
// the best model worded apart, names that break only between their parts,
// every finding said once, the integrity check at the top, and the fields of
// later records (inference, intervals, averaging coverage) shown when present.
import t from 'tap';
import { DEFAULT_POLICY } from '../../src/core/scoring/policy.ts';
import { formatCriterionDelta, formatRatio, formatSignificant, scientific } from '../../src/render/number-format.ts';
import { renderReportHtml } from '../../src/render/report-html.ts';
import { PREDICTION_ROWS_SHOWN } from '../../src/render/report-coefficients.ts';
import { reportStyle } from '../../src/render/report-style.ts';
import type { StoredComparisonView } from '../../src/render/types.ts';
import { defaultPolicyBands, fixtureRecord, kilnRecord } from './fixture-record.ts';
import { summariseHtml } from './parse-with-python.ts';

const textOf = (record: StoredComparisonView) => summariseHtml(renderReportHtml(record)).text;
const rowsOf = (record: StoredComparisonView, table: string) => summariseHtml(renderReportHtml(record)).rows.filter((r) => r.table === table);

t.test('one number style: powers of ten written out, never the e notation', async (t) => {
  t.equal(scientific(1.7346812e54, 3), '1.73\u00a0×\u00a010⁵⁴');
  t.equal(scientific(-2.79e-5, 3), '-2.79\u00a0×\u00a010⁻⁵');
  t.equal(scientific(1e21, 3), '1\u00a0×\u00a010²¹');
  t.equal(formatRatio(1.7346812e54), '1.73\u00a0×\u00a010⁵⁴');
  t.same([1, 2.20283, 86.1759, 812.7, 123456.7].map((x) => formatRatio(x)), ['1', '2.2', '86.2', '813', '123457']);
  t.equal(formatSignificant(1.89924e-5), '1.89924\u00a0×\u00a010⁻⁵');
  // Differences of leave-one-out and adjusted R² keep four decimals, with a floor.
  t.same([0, 2.79e-5, 0.000775, 0.31104].map((x) => formatCriterionDelta('loo', x)), ['0.0000', '< 0.0001', '0.0008', '0.3110']);

  // A ranking whose worst model is 10⁵⁴ times less supported: no "e54" anywhere on the page.
  const record = fixtureRecord([
    { name: 'curve+moisture+kiln', rss: 2.714, parameters: 6 },
    { name: 'temperature', rss: 24.74, parameters: 3 },
  ], { n: 116, tss: 65 });
  const text = textOf(record);
  t.notMatch(text, /\de[+-]?\d/, 'no e notation');
  t.match(text, /1\.75\u00a0×\u00a010⁵⁴/, 'the evidence ratio of the worst model');
});

t.test('conventions in words: no JSON key on the page', async (t) => {
  const record = kilnRecord();
  record.result.conventions = {
    version: '1', parameterCount: 'k = coefficients plus one for the error variance', rankBy: 'aicc',
    rankByReason: 'the default of policy "parsimetry-default"', confidenceLevel: 0.95, intervalLevel: 0.9, predictionScale: 'original',
  };
  const text = textOf(record);
  for (const key of ['parameterCount', 'rankByReason', 'confidenceLevel', 'intervalLevel', 'predictionScale', 'rankBy']) t.notOk(text.includes(key), `${key} not shown as a key`);
  t.match(text, /parameters \(k\)\s*k = coefficients/);
  t.match(text, /ranked by\s*AICc/);
  t.match(text, /why that criterion\s*the default of policy/);
  t.match(text, /confidence set\s*the best models holding 95% of the weight/);
  t.match(text, /intervals\s*90%/);
  t.match(text, /prediction scale\s*original/, 'a convention added later reads in words too');
});

t.test('the best model reads "best" in every ranking, never a band against itself', async (t) => {
  const record = kilnRecord('kiln trial, March', defaultPolicyBands);
  const bic = rowsOf(record, 'bic');
  t.equal(bic[0].cells[4], 'best');
  t.notMatch(bic[0].cells.join(' '), /barely worth a mention/);
  t.equal(bic[1].cells[4], DEFAULT_POLICY.bicBands[1].wording, 'the others keep the policy\'s words');
  t.match(textOf(record), /The best model \(Δ = 0\) reads “best”/);
  // Two models tied for best say so.
  const tied = fixtureRecord([{ name: 'linear', rss: 3, parameters: 3 }, { name: 'linear-again', rss: 3, parameters: 3 }]);
  t.same(rowsOf(tied, 'aicc').map((r) => r.cells[4]), ['tied for best', 'tied for best']);
});

t.test('models in two tables that fit a page column: criteria, and fit with σ, PRESS and leave-one-out', async (t) => {
  const record = kilnRecord();
  record.result.models.forEach((m, i) => { m.press = 4.4 + i / 10; m.looRmse = 0.33 + i / 100; });
  const parsed = summariseHtml(renderReportHtml(record));
  const criteria = parsed.rows.filter((r) => r.table === 'models');
  const fit = parsed.rows.filter((r) => r.table === 'model-fit');
  t.equal(criteria[0].cells.length, 9, 'model, source, k, n, log-likelihood, AIC, AICc, BIC, HQC');
  t.equal(fit[0].cells.length, 7, 'model, RSS, σ, R², adjusted R², PRESS, leave-one-out RMSE');
  t.same(fit[0].cells.slice(5), ['4.4', '0.33']);
  t.match(parsed.text, /Fit of each model.*σ.*PRESS.*leave-one-out RMSE/s);
});

t.test('names break between their parts, never inside a word', async (t) => {
  const record = fixtureRecord([{ name: 'curve+moisture+kiln+hold', rss: 3, parameters: 7 }, { name: 'plain', rss: 3.2, parameters: 3 }]);
  const html = renderReportHtml(record);
  t.match(html, /<td class="name">curve\+<wbr>moisture\+<wbr>kiln\+<wbr>hold<\/td>/);
  t.notMatch(reportStyle, /td\.name \{[^}]*overflow-wrap: anywhere/, 'no breaking anywhere inside a name');
  t.match(reportStyle, /td\.name \{[^}]*overflow-wrap: break-word/);
});

t.test('every finding once: shared cautions grouped, diagnostics findings not repeated, the standing caution not doubled', async (t) => {
  const record = kilnRecord();
  const shared = 'These checks and the criteria rank and screen models; they do not validate them.';
  const finding = 'A few rows carry much of the fit.';
  record.result.cautions = [
    { code: 'ranking_is_not_validation', message: 'Criteria rank the candidate models against each other; they do not validate any of them.' },
    { code: 'rows_dropped', message: '2 rows were left out.', rowsDropped: 2 },
  ];
  for (const m of record.result.models) {
    m.cautions = [{ code: 'assumption_check', message: shared }];
    m.diagnostics = { cautions: [] };
  }
  record.result.models[1].cautions!.push({ code: 'assumption_check', message: finding });
  record.result.models[1].diagnostics = { cautions: [finding] };
  const text = textOf(record);
  const count = (s: string) => text.split(s).length - 1;
  t.equal(count(shared), 1, 'said once');
  t.match(text, new RegExp(`every model: ${shared.replace(/[.;]/g, '\\$&')}`));
  t.equal(count('Criteria rank the candidate models against each other'), 0, 'the standing caution says it');
  t.match(text, /2 rows were left out\. \(rows dropped 2\)/, 'facts in words');
  t.equal(count(finding), 1, 'a finding of the checks is said under Diagnostics only, not again under cautions');
  t.match(text, /listed once, under Diagnostics/);
});

t.test('what the checks found: a finding said of every model comes before the findings of one model', async (t) => {
  const record = kilnRecord();
  const shared = 'Every candidate shares this finding.';
  const own = 'Only the first candidate has this finding.';
  // The shape the diagnostics table reads; the checks themselves are left unavailable.
  const checked = (cautions: string[]) => ({ available: false, reason: 'not computed here', residualNormality: {}, heteroscedasticity: {}, autocorrelation: {}, multicollinearity: {}, influence: {}, cautions });
  for (const m of record.result.models) m.diagnostics = checked([shared]);
  record.result.models[0].diagnostics = checked([own, shared]);
  const text = textOf(record);
  t.match(text, new RegExp(`every model: ${shared.replace(/[.]/g, '\\.')}`));
  t.ok(text.indexOf(`every model: ${shared}`) < text.indexOf(own), 'the shared finding first, though a model listed its own first');
});

t.test('integrity: a failure at the very top, an intact record in one line, nothing when unchecked', async (t) => {
  const failed = { ...kilnRecord(), integrity: { ok: false, reason: 'hash_mismatch', detail: 'Record 17 no longer hashes to its stored hash.' } };
  const html = renderReportHtml(failed);
  t.ok(html.indexOf('data-integrity="failed"') < html.indexOf('<h1'), 'before the heading');
  t.match(html, /role="alert"/);
  t.match(summariseHtml(html).text, /This record fails its integrity check \(hash_mismatch\)\. Record 17 no longer hashes to its stored hash\./);
  t.match(summariseHtml(html).text, /integrity\s*FAILED \(hash_mismatch\) when this page was made/);
  const ok = renderReportHtml({ ...kilnRecord(), integrity: { ok: true, reason: null, detail: 'Record 17 hashes to its stored hash.' } });
  t.match(summariseHtml(ok).text, /Integrity checked when this page was made: Record 17 hashes to its stored hash\./);
  t.notMatch(renderReportHtml(kilnRecord()), /data-integrity/);
});

t.test('inference and intervals are shown when the record has them', async (t) => {
  const record = kilnRecord();
  record.result.conventions = { ...record.result.conventions, intervalLevel: 0.95 };
  record.result.models[0].coefficients = [
    { term: 'intercept', estimate: -14.2, standardError: 1.9, tStatistic: -7.47, pValue: 0.00000001, lower: -18.05, upper: -10.35 },
    { term: 'peakTemp', estimate: 0.0123, standardError: 0.0021, tStatistic: 5.86, pValue: 0.0000009, lower: 0.00805, upper: 0.01655 },
  ];
  record.result.models[0].predictions = [{ estimate: 6.83, standardError: 0.05, lower: 6.73, upper: 6.93, predictionLower: 6.16, predictionUpper: 7.5, scale: 'original' }];
  record.result.averaged = { models: ['linear', 'quadratic'], weightCovered: 0.84, terms: [{ term: 'peakTemp', estimate: 0.012, unconditionalStandardError: 0.003, importance: 1 }], predictions: [] };
  const parsed = summariseHtml(renderReportHtml(record));
  t.match(parsed.text, /termestimatestandard errortp95% confidence interval/);
  t.match(parsed.text, /peakTemp0\.01230\.00215\.86< 0\.0001\[0\.00805, 0\.01655\]/);
  t.match(parsed.text, /95% interval for the mean95% interval for a new observationscale/);
  t.match(parsed.text, /16\.830\.05\[6\.73, 6\.93\]\[6\.16, 7\.5\]original/);
  t.match(parsed.text, /Coefficients averaged over linear, quadratic, which hold 84\.0% of the weight; the other models \(another response scale\) are left out of the coefficients/);
});

t.test('long prediction lists are cut, and the page says how many rows it left out', async (t) => {
  const record = kilnRecord();
  record.result.models[0].predictions = Array.from({ length: 120 }, (_, i) => ({ estimate: 6 + i / 100, standardError: 0.05 }));
  const text = textOf(record);
  t.match(text, new RegExp(`Showing the first ${PREDICTION_ROWS_SHOWN} of 120 prediction rows; the stored record`));
});
