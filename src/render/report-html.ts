// GET /v1/comparisons/{id}/report: one self-contained page for a person.
// No scripts at all and nothing fetched from anywhere: the stylesheet and
// the chart are inline, and the Content-Security-Policy forbids everything
// else, so even a name that slipped past escaping could not run or load.
import { defaultCriterion } from './chart-options.ts';
import { renderChartSvg } from './chart-svg.ts';
import { criterionDisplayName } from './criteria.ts';
import { fragment, raw, tag, type Html } from './html-markup.ts';
import { formatCount } from './number-format.ts';
import { chainSection, defaultChainVerification, type ChainVerification } from './report-chain.ts';
import { coefficientTables, predictionsSection } from './report-coefficients.ts';
import { datasetAndConventions } from './report-conventions.ts';
import { diagnosticsSection } from './report-diagnostics.ts';
import { averagedSection, cautionsSection, nestedTestsSection } from './report-extras.ts';
import { censoringLine, modelKindsTable, percentilesTable, quasiRankingTables } from './report-kinds.ts';
import { integrityNotice } from './report-integrity.ts';
import { lifePictureSection } from './report-life.ts';
import { reportStyle } from './report-style.ts';
import { breakableName, factsList } from './report-table.ts';
import { modelFitTable, modelsTable, rankingTables, supportNote } from './report-tables.ts';
import type { StoredComparisonView } from './types.ts';

export interface ReportOptions {
  /** The chart, as renderChartSvg made it (trusted markup, inserted as is). Drawn with default options when absent. */
  chartSvg?: string;
  /** The audit store's hashing rule, in words. */
  chain?: ChainVerification;
}

export const reportContentSecurityPolicy = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'";

function plural(count: number | null | undefined, word: string): string {
  return `${formatCount(count)} ${word}${count === 1 ? '' : 's'}`;
}

/** The job in one sentence: what was compared, on what, and who came first. */
export function jobSentence(record: StoredComparisonView): string {
  const r = record.result;
  const criterion = defaultCriterion(record);
  const response = r.dataset?.response ?? 'the response';
  const dropped = r.dataset?.rowsDropped ? ` (${plural(r.dataset.rowsDropped, 'row')} with missing values left out)` : '';
  const data = typeof r.dataset?.observations === 'number' ? ` on ${plural(r.dataset.observations, 'observation')}${dropped}` : '';
  const models = r.models?.length ?? 0;
  let ranking = '';
  if (criterion !== null) {
    const best = r.verdict?.best?.[criterion] ?? r.rankings?.[criterion]?.[0]?.name;
    ranking = best ? `; by ${criterionDisplayName(criterion)} the best is ${best}` : '';
  }
  const agree = r.verdict?.agree === true ? ', and the criteria agree' : r.verdict?.agree === false ? ', but the criteria disagree' : '';
  return `Compared ${plural(models, 'candidate model')} of ${response}${data}${ranking}${agree}.`;
}


function recordFacts(record: StoredComparisonView): Html {
  const entries: [string, Html | string][] = [
    ['comparison', tag('span', { class: 'hash' }, String(record.id))],
    ['stored', String(record.createdAt ?? '')],
  ];
  if (typeof record.label === 'string' && record.label !== '') entries.push(['label', record.label]);
  const policy = record.result.policy;
  if (policy && (policy.name || policy.hash)) {
    entries.push(['policy', fragment(String(policy.name ?? ''), policy.hash ? fragment(' ', tag('span', { class: 'hash' }, String(policy.hash))) : null)]);
  }
  return factsList(entries, { 'data-section': 'record' });
}

export function renderReportHtml(record: StoredComparisonView, options: ReportOptions = {}): string {
  const r = record.result;
  const criterion = defaultCriterion(record);
  const chart =
    options.chartSvg ?? (criterion === null ? '' : renderChartSvg(record, { criterion, width: 720, height: null }));
  const heading = typeof record.label === 'string' && record.label.trim() !== '' ? record.label : `Comparison ${record.id}`;
  const main = tag('main', {},
    tag('header', {},
      integrityNotice(record),
      tag('h1', {}, breakableName(heading)),
      tag('p', { class: 'job' }, jobSentence(record)),
      typeof r.verdict?.summary === 'string' && r.verdict.summary !== '' ? tag('p', { class: 'summary' }, r.verdict.summary) : null,
      recordFacts(record),
    ),
    datasetAndConventions(record),
    tag('h2', { id: 'chart' }, 'Picture of the ranking'),
    chart === '' ? tag('p', { class: 'note' }, 'No ranking to draw.') : tag('figure', { class: 'chart', style: 'margin:0' }, raw(chart.trim())),
    tag('h2', { id: 'rankings' }, 'Rankings'),
    tag('p', { class: 'note' }, 'One table per criterion. Δ is the distance from the best model; weights are shares of support summing to 100% over the candidates ranked.'),
    supportNote(record),
    rankingTables(record),
    quasiRankingTables(record),
    tag('h2', { id: 'models-heading' }, 'Models'),
    modelKindsTable(record),
    censoringLine(record),
    modelsTable(record),
    modelFitTable(record),
    percentilesTable(record),
    lifePictureSection(record),
    nestedTestsSection(record),
    averagedSection(record),
    diagnosticsSection(record),
    tag('h2', { id: 'coefficients' }, 'Coefficients'),
    coefficientTables(record),
    predictionsSection(record),
    cautionsSection(record),
    chainSection(record, options.chain ?? defaultChainVerification),
    tag('footer', {}, 'Produced by parsimetry from the stored record; the numbers are those of the record, not recomputed for this page.'),
  );
  return reportDocument(`${heading} · parsimetry report`, main);
}

/** The whole page around its main element: the policy, the style sheet and the title, nothing loaded from anywhere. */
export function reportDocument(title: string, main: Html): string {
  const head = tag('head', {},
    raw('<meta charset="utf-8">'),
    raw(`<meta http-equiv="Content-Security-Policy" content="${reportContentSecurityPolicy}">`),
    raw('<meta name="viewport" content="width=device-width, initial-scale=1">'),
    raw('<meta name="color-scheme" content="light">'),
    // An empty data: icon stops the browser asking the service for /favicon.ico.
    raw('<link rel="icon" href="data:,">'),
    tag('title', {}, title),
    raw(`<style>${reportStyle}</style>`),
  );
  return `<!DOCTYPE html>\n<html lang="en">${head.html}<body>${main.html}</body></html>\n`;
}
