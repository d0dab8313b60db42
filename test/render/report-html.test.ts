import t from 'tap';
import { renderChartSvg } from '../../src/render/chart-svg.ts';
import { renderReportHtml, reportContentSecurityPolicy } from '../../src/render/report-html.ts';
import { standingCaution } from '../../src/render/report-extras.ts';
import { fixtureRecord, kilnRecord } from './fixture-record.ts';
import { summariseHtml } from './parse-with-python.ts';

t.test('self-contained: no scripts, nothing fetched, a strict content security policy', async (t) => {
  const html = renderReportHtml(kilnRecord());
  t.match(html, /^<!DOCTYPE html>\n<html lang="en">/);
  t.notMatch(html, /<script/i);
  t.notMatch(html, /\son[a-z]+\s*=/i, 'no inline event handlers');
  // Every src/href is a data: URL or a fragment; every CSS url() points inside the page.
  for (const m of html.matchAll(/\s(?:src|href)="([^"]*)"/g)) t.match(m[1], /^(data:|#)/, `link ${m[1]}`);
  for (const m of html.matchAll(/url\(([^)]*)\)/g)) t.match(m[1], /^#/, `css url ${m[1]}`);
  t.notMatch(html, /@import/);
  t.ok(html.includes(`<meta http-equiv="Content-Security-Policy" content="${reportContentSecurityPolicy}">`));
  t.match(reportContentSecurityPolicy, /default-src 'none'/);
  t.match(html, /@media print/);
});

t.test('a row per model in the models table and in every ranking table', async (t) => {
  const record = kilnRecord();
  const parsed = summariseHtml(renderReportHtml(record));
  const names = record.result.models.map((m) => m.name);
  const byTable = (table: string) => parsed.rows.filter((r) => r.table === table).map((r) => r.model);
  t.same(byTable('models'), names);
  for (const criterion of ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2']) {
    t.same(byTable(criterion).sort(), [...names].sort(), `${criterion} ranking lists every model`);
  }
  // The model's name is the row's visible text too, not only its attribute.
  const models = parsed.rows.filter((r) => r.table === 'models');
  t.same(models.map((r) => r.cells[0]), names);
  const aicc = parsed.rows.filter((r) => r.table === 'aicc');
  t.same(aicc[2].cells.slice(0, 5), ['3', 'linear', '29.066', '3.29', 'between bands']);
});

t.test('the job in one line, data set, conventions, chain position and how to verify it', async (t) => {
  const record = kilnRecord();
  const text = summariseHtml(renderReportHtml(record)).text;
  t.match(text, /Compared 5 candidate models of shrinkage on 40 observations \(2 rows with missing values left out\); by AICc the best is quadratic, but the criteria disagree\./);
  t.match(text, /fingerprint\s*sha256:c{64}/);
  t.match(text, /parameters \(k\)\s*coefficients plus error variance/, 'conventions under names of their own, not JSON keys');
  t.match(text, /record 17/);
  t.ok(text.includes(record.hash) && text.includes(record.prevHash!));
  t.match(text, /GET \/v1\/audit\/verify/);
  t.match(text, /GET \/v1\/audit\/records\/cmp_0001/, 'the raw record, exactly as hashed');
});

t.test('the hashing rule is a parameter, written as given', async (t) => {
  const html = renderReportHtml(kilnRecord(), {
    chain: { verifyPath: '/v1/audit/verify', algorithm: 'SHA-256', hashedInput: 'the bytes P || C where P is prevHash & C the canonical JSON', encoding: 'lower-case hex' },
  });
  t.ok(html.includes('its hash is SHA-256 over the bytes P || C where P is prevHash &amp; C the canonical JSON, written in lower-case hex.'));
});

t.test('the first record of a chain says it has no predecessor', async (t) => {
  // src/audit/chain.ts starts the chain from 64 zeros; null is accepted too.
  for (const prevHash of [null, '0'.repeat(64)]) {
    const record = kilnRecord();
    record.prevHash = prevHash;
    t.match(summariseHtml(renderReportHtml(record)).text, /none: this is the first record/);
  }
  t.notMatch(summariseHtml(renderReportHtml(kilnRecord())).text, /none: this is the first record/);
});

t.test('by default the page states the audit store\'s own hashing rule', async (t) => {
  const text = summariseHtml(renderReportHtml(kilnRecord())).text;
  t.match(text, /its hash is SHA-256 over the UTF-8 bytes of the previous record's hash .* followed by the canonical JSON of this record without its prevHash and hash fields/);
});

t.test('the chart is inlined as given; without one it is drawn with the record\'s criterion', async (t) => {
  const record = kilnRecord();
  const chart = renderChartSvg(record, { criterion: 'bic', width: 600, height: null });
  const html = renderReportHtml(record, { chartSvg: chart });
  t.ok(html.includes(chart.trim()));
  t.equal(html.split('<svg').length - 1, 1);
  t.match(renderReportHtml(record), /<svg[^>]*data-criterion="aicc"/);
});

t.test('cautions: the standing one always, the record\'s and each model\'s with their facts', async (t) => {
  const plain = summariseHtml(renderReportHtml(kilnRecord())).text;
  t.ok(plain.includes(standingCaution));
  t.match(standingCaution, /do not show that any of them is valid/);
  t.match(standingCaution, /defer to review/);
  const record = kilnRecord();
  record.result.cautions = ['A candidate was fitted on a log scale.'];
  record.result.models[3].cautions = [{ code: 'high_leverage', message: 'one row has high leverage', row: 12, leverage: 0.61 }];
  const text = summariseHtml(renderReportHtml(record)).text;
  t.match(text, /A candidate was fitted on a log scale\./);
  t.match(text, /with-moisture: one row has high leverage \(row 12; leverage 0\.61\)/);
});

t.test('nested tests, averaged estimates and diagnostics appear only when present', async (t) => {
  const bare = renderReportHtml(kilnRecord());
  for (const id of ['nested', 'averaged', 'diagnostics']) t.notMatch(bare, new RegExp(`id="${id}"`));
  const record = kilnRecord();
  record.result.nestedTests = [{ smaller: 'linear', larger: 'quadratic', df: 1, fStatistic: 5.4, fPValue: 0.0258, lrStatistic: 5.6, lrPValue: 0.00001 }];
  record.result.averaged = { terms: [{ term: 'peakTemp', estimate: 0.0121, unconditionalStandardError: 0.0025, importance: 1 }], predictions: [{ estimate: 1.2, standardError: 0.1 }] };
  record.result.models[0].diagnostics = { durbinWatson: 1.93, largestLeverage: { row: 4, value: 0.31 } };
  const html = renderReportHtml(record);
  const text = summariseHtml(html).text;
  for (const id of ['nested', 'averaged', 'diagnostics']) t.match(html, new RegExp(`id="${id}"`));
  t.match(text, /linearquadratic15\.40\.02585\.6< 0\.0001/, 'nested test row: df, F, p, LR, p');
  t.match(text, /peakTemp0\.01210\.00251/);
  t.match(text, /durbinWatson: 1\.93/);
});

t.test('names and labels with markup are shown as text, never run', async (t) => {
  const hostile = '<img src=x onerror=alert(1)><script>alert(2)</script>';
  const record = fixtureRecord([
    { name: hostile, rss: 3.1, parameters: 3 },
    { name: '" data-x="1', rss: 3.2, parameters: 4 },
    { name: 'a & b\u0007', rss: 3.3, parameters: 3 },
  ], { label: '</title><script>alert(3)</script>' });
  record.result.cautions = [hostile];
  const html = renderReportHtml(record);
  const parsed = summariseHtml(html);
  t.notOk(parsed.startTags.includes('script'));
  t.notOk(parsed.startTags.includes('img'));
  t.same(parsed.rows.filter((r) => r.table === 'models').map((r) => r.model), [hostile, '" data-x="1', 'a & b\uFFFD']);
  t.same(parsed.rows.filter((r) => r.table === 'models').map((r) => r.cells[0]), [hostile, '" data-x="1', 'a & b\uFFFD']);
  t.equal(parsed.title, '</title><script>alert(3)</script> · parsimetry report');
  t.ok(parsed.text.includes(hostile), 'the caution reads as written');
});

t.test('identical bytes for the same record', async (t) => {
  t.equal(renderReportHtml(kilnRecord()), renderReportHtml(structuredClone(kilnRecord())));
});

// The shape of src/core/diagnostics/types.ts ModelDiagnostics; numbers invented.
function diagnostics(over: { bpP: number; bpPassed: boolean; cautions: string[] }) {
  return {
    available: true,
    reason: null,
    residualNormality: { test: 'Jarque–Bera', statistic: 1.7, df: 2, pValue: 0.42, skewness: 0.06, kurtosis: 2.4, alpha: 0.05, passed: true, note: 'Jarque–Bera is a large-sample test.' },
    heteroscedasticity: { test: 'Breusch–Pagan (studentised, Koenker)', statistic: 7.2, df: 1, pValue: over.bpP, alpha: 0.05, passed: over.bpPassed, note: null },
    autocorrelation: { test: 'Durbin–Watson', statistic: 1.77, acceptableRange: [1.5, 2.5], passed: true, note: 'Only meaningful in time order.' },
    multicollinearity: { varianceInflationFactors: [{ term: 'peakTemp', vif: 1 }], maxVarianceInflation: 1, varianceInflationThreshold: 10, conditionNumber: 78.3, conditionNumberThreshold: 30, passed: false, note: null },
    influence: { maxCooksDistance: 0.088, maxCooksDistanceRow: 1, cooksDistanceThreshold: 1, leverageThreshold: 0.034, highLeverageRows: 0, highLeverageRowIndices: [], passed: true },
    cautions: over.cautions,
  };
}

t.test('diagnostics: one table row per model, flags in words, each note and caution said once', async (t) => {
  const record = kilnRecord();
  const shared = 'These checks screen models; they do not validate them.';
  record.result.models[0].diagnostics = diagnostics({ bpP: 0.0071, bpPassed: false, cautions: ['The spread of the residuals changes.', shared] });
  record.result.models[1].diagnostics = diagnostics({ bpP: 0.31, bpPassed: true, cautions: [shared] });
  record.result.models[2].diagnostics = { available: false, reason: 'fitted elsewhere', residualNormality: {}, heteroscedasticity: {}, autocorrelation: {}, multicollinearity: {}, influence: {}, cautions: [] };
  const html = renderReportHtml(record);
  const parsed = summariseHtml(html);
  // Only the diagnostics table has rows with data-model and no table id.
  const diag = parsed.rows.filter((r) => r.table === null);
  t.same(diag.map((r) => r.model), ['linear', 'quadratic', 'by-kiln'], 'a row per model with diagnostics');
  t.equal(diag[0].cells[2], '0.0071 · flagged', 'a failed check says so in words');
  t.equal(diag[1].cells[2], '0.3100', 'p-values to four decimals, as elsewhere in the report');
  // The collinearity check failed on its condition number alone (78.3 > 30): only that cell says so.
  t.equal(diag[0].cells[4], '1', 'a VIF of 1 is not flagged though its check failed');
  t.equal(diag[0].cells[5], '78.3 · flagged', 'the condition number over its threshold is');
  t.same(diag[0].cells.slice(6), ['0.088', '0'], "Cook's distance and high-leverage rows in columns of their own");
  t.equal(diag[2].cells[1], 'not available: fitted elsewhere');
  const count = (s: string) => parsed.text.split(s).length - 1;
  t.equal(count('Jarque–Bera is a large-sample test.'), 1, 'a note said once, not per model');
  t.equal(count(shared), 1, 'a shared caution said once');
  t.match(parsed.text, /linear, quadratic: These checks screen models/, 'with the models it concerns');
  t.match(parsed.text, /Flagged when: p below 0\.05 is flagged; Durbin–Watson outside 1\.5 to 2\.5/);
});
