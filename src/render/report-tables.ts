// The report's tables of models, rankings and coefficients. Every model row
// carries data-model with the model's name, so a reader's tools (and the
// browser test) can find it without parsing the text.
import { rankedCriteria } from './chart-options.ts';
import { criterionDisplayName } from './criteria.ts';
import { describeBands } from './band-legend.ts';
import { bandsApply, entryBandWording, ownBands } from './delta-bands.ts';
import { firstRows, leftOutNote, REPORT_ROW_LIMITS } from './bounded-rows.ts';
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatCount, formatCriterionDelta, formatFixed, formatPercent, formatSignificant } from './number-format.ts';
import type { CriterionName, ModelView, RankingEntry, StoredComparisonView } from './types.ts';

interface Column<Row> {
  heading: string;
  cell: (row: Row) => string;
  className?: string;
}

function table<Row>(caption: string | null, columns: Column<Row>[], rows: Row[], rowAttrs: (row: Row) => Record<string, string | null>, attrs: Record<string, string> = {}): Html {
  const head = tag('thead', {}, tag('tr', {}, ...columns.map((c) => tag('th', { scope: 'col', class: c.className }, c.heading))));
  const body = tag('tbody', {}, ...rows.map((r) => tag('tr', rowAttrs(r), ...columns.map((c) => tag('td', { class: c.className }, c.cell(r))))));
  return tag('div', { class: 'table-wrap' }, tag('table', attrs, caption === null ? null : tag('caption', {}, caption), head, body));
}

const present = (models: ModelView[], pick: (m: ModelView) => unknown) => models.some((m) => finiteOrNull(pick(m)) !== null);

export function modelsTable(record: StoredComparisonView): Html {
  const models = record.result.models ?? [];
  const columns: Column<ModelView>[] = [
    { heading: 'model', cell: (m) => m.name, className: 'name' },
    { heading: 'source', cell: (m) => m.source ?? '', className: 'words' },
    { heading: 'k', cell: (m) => formatCount(m.parameters) },
    { heading: 'n', cell: (m) => formatCount(m.observations) },
    { heading: 'log-likelihood', cell: (m) => formatFixed(m.logLikelihood, 3) },
    { heading: 'AIC', cell: (m) => formatFixed(m.aic, 3) },
    { heading: 'AICc', cell: (m) => formatFixed(m.aicc, 3) },
    { heading: 'BIC', cell: (m) => formatFixed(m.bic, 3) },
    { heading: 'HQC', cell: (m) => formatFixed(m.hqc, 3) },
    { heading: 'RSS', cell: (m) => formatSignificant(m.rss) },
    { heading: 'R²', cell: (m) => formatFixed(m.r2, 4) },
    { heading: 'adjusted R²', cell: (m) => formatFixed(m.adjustedR2, 4) },
    { heading: 'σ', cell: (m) => formatSignificant(m.sigma) },
  ];
  if (present(models, (m) => m.press)) columns.push({ heading: 'PRESS', cell: (m) => formatSignificant(m.press) });
  if (present(models, (m) => m.looRmse)) columns.push({ heading: 'LOO RMSE', cell: (m) => formatSignificant(m.looRmse) });
  return table('One row per candidate model', columns, models, (m) => ({ 'data-model': m.name }), { id: 'models' });
}

function supportWords(criterion: CriterionName, entry: RankingEntry): string {
  return entryBandWording({ band: entry.band, delta: finiteOrNull(entry.delta) }, criterion) ?? '';
}

function yesNo(value: boolean | null | undefined): string {
  return value === true ? 'yes' : value === false ? 'no' : 'n/a';
}

export function rankingTable(record: StoredComparisonView, criterion: CriterionName): Html {
  const entries = record.result.rankings?.[criterion] ?? [];
  const weighted = entries.some((e) => finiteOrNull(e.weight) !== null);
  const columns: Column<RankingEntry>[] = [
    { heading: 'rank', cell: (e) => formatCount(e.rank) },
    { heading: 'model', cell: (e) => e.name, className: 'name' },
    { heading: criterionDisplayName(criterion), cell: (e) => formatFixed(e.value, criterion === 'adjustedR2' ? 4 : 3) },
    { heading: 'Δ', cell: (e) => formatCriterionDelta(criterion, e.delta, 'n/a') },
  ];
  if (bandsApply(criterion) || entries.some((e) => typeof e.band === 'string')) {
    columns.push({ heading: 'support', cell: (e) => supportWords(criterion, e), className: 'words support' });
  }
  if (weighted) {
    columns.push(
      { heading: 'weight', cell: (e) => formatPercent(e.weight) },
      { heading: 'evidence ratio', cell: (e) => formatSignificant(e.evidenceRatio) },
      { heading: 'cumulative weight', cell: (e) => formatPercent(e.cumulativeWeight) },
      { heading: 'in confidence set', cell: (e) => yesNo(e.inConfidenceSet), className: 'words' },
    );
  }
  const caption = `Ranked by ${criterionDisplayName(criterion)}` + (criterion === 'adjustedR2' ? ' (larger is better; Δ is the shortfall from the best)' : ' (smaller is better)');
  return table(caption, columns, entries, (e) => ({ 'data-model': e.name, 'data-criterion': criterion, class: finiteOrNull(e.rank) === 1 ? 'leader' : null }), { 'data-ranking': criterion });
}

/** Whose words the support columns carry: the record's policy, or (for records older than bands) this page's. */
export function supportNote(record: StoredComparisonView): Html | null {
  const ranked = rankedCriteria(record);
  const carried = ranked.some((c) => (record.result.rankings?.[c] ?? []).some((e) => typeof e.band === 'string' && e.band !== ''));
  const name = record.result.policy?.name;
  if (carried) {
    const whose = typeof name === 'string' && name !== '' ? `policy “${name}”` : 'the team policy';
    return tag('p', { class: 'note', 'data-support': 'policy' }, `The support column gives the words of ${whose} for each Δ, exactly as the stored result does.`);
  }
  if (!ranked.some((c) => bandsApply(c))) return null;
  return tag('p', { class: 'note', 'data-support': 'own' },
    `This record names no support bands (it predates them); the support column is this page's reading of Δ. For AIC, AICc and HQC: ${describeBands(ownBands.akaike)}. For BIC: ${describeBands(ownBands.bic)}.`);
}

export function rankingTables(record: StoredComparisonView): Html {
  return fragment(...rankedCriteria(record).map((c) => rankingTable(record, c)));
}

export function coefficientTables(record: StoredComparisonView): Html {
  return fragment(
    ...(record.result.models ?? []).map((m) => {
      const rows = firstRows(m.coefficients ?? [], REPORT_ROW_LIMITS.coefficients);
      const aliased = firstRows(m.aliased ?? [], REPORT_ROW_LIMITS.aliasedNames);
      const moreAliased = aliased.total > aliased.shown.length ? ` and ${formatCount(aliased.total - aliased.shown.length)} more` : '';
      return tag(
        'section',
        { class: 'coefficients', 'data-model': m.name },
        tag('h3', {}, m.name),
        rows.total === 0
          ? tag('p', { class: 'note' }, 'No coefficients: this candidate was fitted elsewhere.')
          : table(null, [
              { heading: 'term', cell: (c) => String(c.term), className: 'name' },
              { heading: 'estimate', cell: (c) => formatSignificant(c.estimate) },
              { heading: 'standard error', cell: (c) => formatSignificant(c.standardError) },
            ], rows.shown, () => ({})),
        leftOutNote(rows.shown.length, rows.total, 'coefficients', record.id),
        aliased.total === 0 ? null : tag('p', { class: 'note' }, `Aliased (not estimable from these data, left out of k): ${aliased.shown.join(', ')}${moreAliased}`),
      );
    }),
  );
}
