// GET /v1/searches/{id}/report: one self-contained page about a stored
// search, built from the same pieces as a comparison's report (html-markup,
// report-table, the chart, the cautions, the chain and integrity sections) and
// under the same Content-Security-Policy. Its tables are bounded (a stored
// record may hold anything), and every name passes through the escaping builders.
import { renderChartSvg } from './chart-svg.ts';
import { criterionDisplayName } from './criteria.ts';
import { fragment, raw, tag, type Html } from './html-markup.ts';
import { firstRows, leftOutNote } from './bounded-rows.ts';
import { formatCount, formatDelta, formatFixed, formatPercent, formatRatio } from './number-format.ts';
import { chainSection, defaultChainVerification } from './report-chain.ts';
import { cautionsSection } from './report-extras.ts';
import { reportDocument, type ReportOptions } from './report-html.ts';
import { integrityNotice } from './report-integrity.ts';
import { breakableName, factsList, table } from './report-table.ts';
import type { StoredSearchView } from './search-view.ts';
import type { RankingEntry } from './types.ts';

/** Rows a search report prints per table: a search returns at most 100 models over at most 60 pool terms. */
export const SEARCH_REPORT_ROW_LIMITS = { models: 100, importance: 60 } as const;

const methodWords: Record<string, string> = {
  exhaustive: 'every subset scored',
  branchAndBound: 'branch and bound (subsets that provably cannot enter the best list are not scored one by one)',
  stepwiseSwaps: 'stepwise selection with swaps (a generalised-linear pool too large to fit every subset: the best found, not proven the best)',
};

/** passedOver and budget in words (the JSON keys are for programs). */
const countWords: Record<string, string> = {
  notHierarchical: 'outside the hierarchy rule',
  unscorable: 'without a criterion value',
  pruned: 'proven out of the top list by branch and bound',
  rankDeficient: 'with aliased columns (a smaller model again)',
  sameColumnSpace: 'spanning the column space of one counted',
  exactFit: 'fitting exactly',
  fitFailed: 'whose IRLS fit separated or did not converge (skipped)',
  maxSubsets: 'at most {} subsets scored one by one',
  maxBranchAndBoundTerms: 'branch and bound up to {} terms',
  maxNodes: 'at most {} tree nodes',
  estimatedFlops: 'about {} multiply-adds estimated',
  nodes: '{} tree nodes visited',
  elapsedMs: 'scored in {} ms',
};

function inWords(key: string, value: number | null): string {
  const count = value === null ? 'n/a' : formatCount(Math.round(value));
  const words = countWords[key];
  if (words === undefined) return `${key} ${count}`;
  return words.includes('{}') ? words.replace('{}', count) : `${count} ${words}`;
}

const transformWords = (t: { fn: string; lambda?: number }) => (t.fn === 'boxcox' ? `Box–Cox, λ = ${formatFixed(t.lambda, 2)}` : t.fn);

/** The job in one sentence: what was searched, on what, and which subset came first. */
export function searchSentence(view: StoredSearchView): string {
  const { ranking, search } = view;
  const r = ranking.result;
  const response = search.responseTransform ? `${transformWords(search.responseTransform)} of ${r.dataset?.response ?? 'the response'}` : r.dataset?.response ?? 'the response';
  const pool = search.importance.length;
  const rows = typeof r.dataset?.observations === 'number' ? ` on ${formatCount(r.dataset.observations)} observations` : '';
  const best = r.models[0]?.name;
  const by = search.rankBy === null ? '' : ` by ${criterionDisplayName(search.rankBy)}`;
  return `Searched subsets of ${formatCount(pool)} pool term${pool === 1 ? '' : 's'} as models of ${response}${rows}; ${formatCount(search.evaluated)} of ${formatCount(search.subsets)} subsets scored${best ? `, and the best${by} is ${best}` : ''}.`;
}

function searchFacts(view: StoredSearchView): Html {
  const { search, ranking } = view;
  const entries: [string, string | Html][] = [
    ['search', tag('span', { class: 'hash' }, String(ranking.id))],
    ['stored', String(ranking.createdAt ?? '')],
  ];
  if (typeof ranking.label === 'string' && ranking.label !== '') entries.push(['label', ranking.label]);
  entries.push(['method', search.method === null ? 'not recorded' : methodWords[search.method] ?? search.method]);
  entries.push(['ranked by', search.rankBy === null ? 'not recorded' : criterionDisplayName(search.rankBy)]);
  entries.push(['response scale', search.responseTransform ? `${transformWords(search.responseTransform)} (criteria include the Jacobian, so they are on the scale of the response)` : 'the response as sent']);
  entries.push(['proven', search.proven === null ? 'not recorded' : search.proven
    ? 'yes: the listed models are the best of every admissible subset'
    : 'no: the node budget ran out first; the listed models are the best found so far']);
  entries.push(['weights cover', search.weightsCoverAllSubsets ? 'every admissible subset' : 'only the subsets scored (some were pruned)']);
  const passed = search.passedOver.filter(([, n]) => n > 0).map(([k, n]) => inWords(k, n));
  entries.push(['passed over', passed.length === 0 ? 'none' : passed.join(', ')]);
  entries.push(['budget', search.budget.filter(([, v]) => v !== null).map(([k, v]) => inWords(k, v)).join('; ') || 'not recorded']);
  const policy = ranking.result.policy;
  if (policy && (policy.name || policy.hash)) entries.push(['policy', fragment(String(policy.name ?? ''), ' ', tag('span', { class: 'hash' }, String(policy.hash ?? '')))]);
  return factsList(entries, { 'data-section': 'search' });
}

function modelsTable(view: StoredSearchView): Html {
  const criterion = view.search.rankBy;
  const entries = criterion === null ? [] : view.ranking.result.rankings[criterion] ?? [];
  const { shown, total } = firstRows(entries, SEARCH_REPORT_ROW_LIMITS.models);
  const k = new Map(view.ranking.result.models.map((m) => [m.name, m.parameters]));
  return fragment(
    table<RankingEntry>(null, [
      { heading: 'rank', cell: (e) => String(e.rank), className: 'num' },
      { heading: 'model (its terms)', cell: (e) => breakableName(e.name), className: 'name' },
      { heading: 'k', cell: (e) => formatCount(k.get(e.name)), className: 'num' },
      { heading: criterion === null ? 'value' : criterionDisplayName(criterion), cell: (e) => formatFixed(e.value, 2), className: 'num' },
      { heading: 'Δ', cell: (e) => formatDelta(e.delta), className: 'num' },
      { heading: 'weight', cell: (e) => formatPercent(e.weight), className: 'num' },
      { heading: 'evidence ratio', cell: (e) => formatRatio(e.evidenceRatio), className: 'num' },
    ], shown, (e) => ({ 'data-model': e.name }), { 'data-table': 'search-models' }),
    leftOutNote(shown.length, total, 'models', view.ranking.id, '/v1/searches'),
  );
}

function importanceTable(view: StoredSearchView): Html {
  const { shown, total } = firstRows(view.search.importance, SEARCH_REPORT_ROW_LIMITS.importance);
  return fragment(
    table<(typeof shown)[number]>(null, [
      { heading: 'pool term', cell: (x) => breakableName(x.label), className: 'name' },
      { heading: 'importance', cell: (x) => formatPercent(x.weight), className: 'num' },
    ], shown, (x) => ({ 'data-term': x.label }), { 'data-table': 'importance' }),
    leftOutNote(shown.length, total, 'pool terms', view.ranking.id, '/v1/searches'),
  );
}

export function renderSearchReportHtml(view: StoredSearchView, options: ReportOptions = {}): string {
  const record = view.ranking;
  const criterion = view.search.rankBy;
  const chart = options.chartSvg ?? (criterion === null ? '' : renderChartSvg(record, { criterion, width: 720, height: null }));
  const heading = typeof record.label === 'string' && record.label.trim() !== '' ? record.label : `Search ${record.id}`;
  const main = tag('main', {},
    tag('header', {}, integrityNotice(record), tag('h1', {}, breakableName(heading)), tag('p', { class: 'job' }, searchSentence(view)), searchFacts(view)),
    tag('h2', { id: 'chart' }, 'Picture of the best subsets'),
    chart === '' ? tag('p', { class: 'note' }, 'No ranking to draw.') : tag('figure', { class: 'chart', style: 'margin:0' }, raw(chart.trim())),
    tag('h2', { id: 'models-heading' }, 'Best subsets'),
    tag('p', { class: 'note' }, 'Δ and weights are over every subset the search scored, not only the ones listed, so the listed weights may sum to less than 100%.'),
    modelsTable(view),
    tag('h2', { id: 'importance' }, 'Importance of each pool term'),
    tag('p', { class: 'note' }, 'The summed weight of the scored subsets that hold the term: near 100% when every well-supported subset holds it.'),
    importanceTable(view),
    cautionsSection(record),
    chainSection(record, options.chain ?? defaultChainVerification),
    tag('footer', {}, 'Produced by parsimetry from the stored record; the numbers are those of the record, not recomputed for this page.'),
  );
  return reportDocument(`${heading} · parsimetry search report`, main);
}
