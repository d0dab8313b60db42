// The report's tables of models and rankings. Every model row carries
// data-model with the model's name, so a reader's tools (and the browser
// test) can find it without parsing the text. The models' numbers come in two
// tables (criteria; fit), so each fits a desktop page column and a printed
// page without sideways scrolling.
import { rankedCriteria } from './chart-options.ts';
import { criterionDisplayName } from './criteria.ts';
import { describeBands } from './band-legend.ts';
import { bandsApply, countAtBest, ownBands, supportWording } from './delta-bands.ts';
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatCount, formatCriterionDelta, formatFixed, formatPercent, formatRatio, formatSignificant } from './number-format.ts';
import { breakableName, table, type Column } from './report-table.ts';
import type { CriterionName, ModelView, RankingEntry, StoredComparisonView } from './types.ts';

const present = (models: ModelView[], pick: (m: ModelView) => unknown) => models.some((m) => finiteOrNull(pick(m)) !== null);

const nameColumn: Column<ModelView> = { heading: 'model', cell: (m) => breakableName(m.name), className: 'name' };

/** Each model's likelihood and criteria: the values the rankings below are made of. */
export function modelsTable(record: StoredComparisonView): Html {
  const models = record.result.models ?? [];
  const columns: Column<ModelView>[] = [
    nameColumn,
    { heading: 'source', cell: (m) => m.source ?? '', className: 'words' },
    { heading: 'k', cell: (m) => formatCount(m.parameters) },
    { heading: 'n', cell: (m) => formatCount(m.observations) },
    { heading: 'log-likelihood', cell: (m) => formatFixed(m.logLikelihood, 3) },
    { heading: 'AIC', cell: (m) => formatFixed(m.aic, 3) },
    { heading: 'AICc', cell: (m) => formatFixed(m.aicc, 3) },
    { heading: 'BIC', cell: (m) => formatFixed(m.bic, 3) },
    { heading: 'HQC', cell: (m) => formatFixed(m.hqc, 3) },
  ];
  return table('Criteria of each model (k counts every estimated parameter: the coefficients, and the error variance or the distribution\'s own parameters)', columns, models, (m) => ({ 'data-model': m.name }), { id: 'models' });
}

/** Each model's fit: residual sums, R², σ and, when the record has them, leave-one-out errors. */
export function modelFitTable(record: StoredComparisonView): Html | null {
  const models = record.result.models ?? [];
  // Life models and non-Gaussian families have no residual sum of squares: no table of n/a.
  if (models.length > 0 && !models.some((m) => [m.rss, m.sigma, m.r2, m.adjustedR2, m.press, m.looRmse].some((v) => finiteOrNull(v) !== null))) return null;
  const columns: Column<ModelView>[] = [
    nameColumn,
    { heading: 'RSS', cell: (m) => formatSignificant(m.rss) },
    { heading: 'σ', cell: (m) => formatSignificant(m.sigma) },
    { heading: 'R²', cell: (m) => formatFixed(m.r2, 4) },
    { heading: 'adjusted R²', cell: (m) => formatFixed(m.adjustedR2, 4) },
  ];
  if (present(models, (m) => m.press)) columns.push({ heading: 'PRESS', cell: (m) => formatSignificant(m.press) });
  if (present(models, (m) => m.looRmse)) columns.push({ heading: 'leave-one-out RMSE', cell: (m) => formatSignificant(m.looRmse) });
  return table('Fit of each model (σ: residual standard error; PRESS: sum of squared leave-one-out errors)', columns, models, (m) => ({ 'data-model': m.name }), { id: 'model-fit' });
}

function yesNo(value: boolean | null | undefined): string {
  return value === true ? 'yes' : value === false ? 'no' : 'n/a';
}

function criterionValue(criterion: CriterionName, value: unknown): string {
  if (criterion === 'adjustedR2') return formatFixed(value, 4);
  // Leave-one-out errors of close models differ in the fourth significant digit.
  if (criterion === 'loo') return formatSignificant(value, 'n/a', 4);
  return formatFixed(value, 3);
}

const captions: Record<CriterionName, string> = {
  aicc: 'Ranked by AICc (smaller is better)',
  aic: 'Ranked by AIC (smaller is better)',
  bic: 'Ranked by BIC (smaller is better)',
  hqc: 'Ranked by HQC (smaller is better)',
  adjustedR2: 'Ranked by adjusted R² (larger is better; Δ is the shortfall from the best)',
  qaic: 'Ranked by QAIC (smaller is better; −2 log L divided by ĉ, plus 2k)',
  qaicc: 'Ranked by QAICc (smaller is better; QAIC with the small-sample term)',
  loo: 'Ranked by leave-one-out RMSE (smaller is better; a check of prediction error, not counted in the verdict)',
};

export function rankingTable(record: StoredComparisonView, criterion: CriterionName): Html {
  return rankingTableOf(record.result.rankings?.[criterion] ?? [], {
    caption: captions[criterion],
    heading: criterionDisplayName(criterion),
    value: (v) => criterionValue(criterion, v),
    delta: (d) => formatCriterionDelta(criterion, d, 'n/a'),
    support: (e, atBest) => supportWording({ band: e.band, delta: finiteOrNull(e.delta) }, criterion, atBest),
    banded: bandsApply(criterion),
    key: criterion,
  });
}

/** How one ranking's numbers are written: the criteria beyond CriterionName (QAIC) reuse the table with their own words. */
export interface RankingWording {
  caption: string;
  heading: string;
  value: (value: unknown) => string;
  delta: (delta: unknown) => string;
  support: (entry: RankingEntry, atBest: number) => string | null;
  /** Whether a support column belongs to this criterion even when no entry carries a band. */
  banded: boolean;
  key: string;
}

export function rankingTableOf(entries: RankingEntry[], wording: RankingWording): Html {
  const weighted = entries.some((e) => finiteOrNull(e.weight) !== null);
  const atBest = countAtBest(entries.map((e) => ({ delta: finiteOrNull(e.delta) })));
  const columns: Column<RankingEntry>[] = [
    { heading: 'rank', cell: (e) => formatCount(e.rank) },
    { heading: 'model', cell: (e) => breakableName(e.name), className: 'name' },
    { heading: wording.heading, cell: (e) => wording.value(e.value) },
    { heading: 'Δ', cell: (e) => wording.delta(e.delta) },
  ];
  if (wording.banded || entries.some((e) => typeof e.band === 'string')) {
    columns.push({ heading: 'support', cell: (e) => wording.support(e, atBest) ?? '', className: 'words support' });
  }
  if (weighted) {
    columns.push(
      { heading: 'weight', cell: (e) => formatPercent(e.weight) },
      { heading: 'evidence ratio', cell: (e) => formatRatio(e.evidenceRatio) },
      { heading: 'cumulative weight', cell: (e) => formatPercent(e.cumulativeWeight) },
      { heading: 'in confidence set', cell: (e) => yesNo(e.inConfidenceSet), className: 'words' },
    );
  }
  return table(wording.caption, columns, entries, (e) => ({ 'data-model': e.name, 'data-criterion': wording.key, class: finiteOrNull(e.rank) === 1 ? 'leader' : null }), { 'data-ranking': wording.key });
}

/** Whose words the support columns carry: the record's policy, or (for records older than bands) this page's. */
export function supportNote(record: StoredComparisonView): Html | null {
  const ranked = rankedCriteria(record);
  const carried = ranked.some((c) => (record.result.rankings?.[c] ?? []).some((e) => typeof e.band === 'string' && e.band !== ''));
  const name = record.result.policy?.name;
  const best = 'The best model (Δ = 0) reads “best”: a band measures the evidence against a model beside the best, not against the best itself.';
  if (carried) {
    const whose = typeof name === 'string' && name !== '' ? `policy “${name}”` : 'the team policy';
    return tag('p', { class: 'note', 'data-support': 'policy' }, `The support column gives the words of ${whose} for each Δ, exactly as the stored result does. ${best}`);
  }
  if (!ranked.some((c) => bandsApply(c))) return null;
  return tag('p', { class: 'note', 'data-support': 'own' },
    `This record names no support bands (it predates them); the support column is this page's reading of Δ. For AIC, AICc and HQC: ${describeBands(ownBands.akaike)}. For BIC: ${describeBands(ownBands.bic)}. ${best}`);
}

/** QAIC and QAICc come after the others, beside the ĉ they use (report-kinds: quasiRankingTables). */
export function rankingTables(record: StoredComparisonView): Html {
  return fragment(...rankedCriteria(record).filter((c) => c !== 'qaic' && c !== 'qaicc').map((c) => rankingTable(record, c)));
}
