// The report's parts for the kinds of model beyond least squares: what each
// model is (family and link, expression, life distribution), its
// distribution's own parameters, how its iterative fit ended, its deviance,
// the censoring of life data, percentiles of life, and the rankings by QAIC.
// Each part appears only when the record has such models, so a record of
// least-squares models renders exactly as before.
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatCount, formatFixed, formatPercent, formatSignificant } from './number-format.ts';
import { whichModels } from './report-extras.ts';
import { breakableName, table, type Column } from './report-table.ts';
import { rankingTable } from './report-tables.ts';
import type { ConvergenceView, ModelView, StoredComparisonView } from './types.ts';

const fittedElsewhere = new Set(['residuals', 'rss', 'logLikelihood']);

/** A model of another kind than least squares fitted here, or one whose kind fields are filled. */
function hasKindFields(m: ModelView): boolean {
  return typeof m.family === 'string' || typeof m.expression === 'string' || typeof m.distribution === 'string'
    || m.source === 'lifetime' || m.source === 'fitted' || (m.distributionParameters?.length ?? 0) > 0
    || (m.convergence !== null && m.convergence !== undefined);
}

/** The kind of a model in a few words. */
export function kindInWords(m: ModelView): string {
  if (m.source === 'lifetime' || typeof m.distribution === 'string') return `life distribution: ${m.distribution ?? 'n/a'}`;
  if (typeof m.expression === 'string') return `nonlinear: ${m.expression}`;
  if (typeof m.family === 'string') {
    const link = typeof m.link === 'string' ? `, ${m.link} link` : '';
    return `generalised linear: ${m.family}${link}${m.source === 'fitted' ? ', means fitted elsewhere' : ''}`;
  }
  if (m.source !== undefined && fittedElsewhere.has(m.source)) return 'fitted elsewhere';
  return 'least squares';
}

/** "shape = 1.83 ± 0.21; scale = 904 ± 77"; a parameter the caller stated has no standard error. */
export function parametersInWords(m: ModelView): string {
  return (m.distributionParameters ?? [])
    .map((p) => {
      const se = finiteOrNull(p.standardError);
      return `${p.name} = ${formatSignificant(p.estimate)}${se === null ? ' (stated)' : ` ± ${formatSignificant(se)}`}`;
    })
    .join('; ');
}

function plural(count: number, word: string): string {
  return `${formatCount(count)} ${word}${count === 1 ? '' : 's'}`;
}

/** "converged after 6 iterations", with what else the record says in a few words. */
export function convergenceInWords(c: ConvergenceView | null | undefined): string {
  if (c === null || c === undefined) return '';
  const iterations = finiteOrNull(c.iterations);
  const after = iterations === null ? '' : ` after ${plural(iterations, 'iteration')}`;
  const extras: string[] = [];
  const halvings = finiteOrNull(c.stepHalvings);
  if (halvings !== null && halvings > 0) extras.push(plural(halvings, 'step halving'));
  if (Array.isArray(c.starts) && c.starts.length > 1 && finiteOrNull(c.start) !== null) extras.push(`from start ${formatCount(c.start)} of ${c.starts.length}`);
  const head = c.converged === false ? 'did not converge' : 'converged';
  return `${head}${after}${extras.length === 0 ? '' : ` (${extras.join(', ')})`}`;
}

const present = (models: ModelView[], pick: (m: ModelView) => unknown) => models.some((m) => finiteOrNull(pick(m)) !== null);

/**
 * What each model is: kind, distribution parameters, convergence, deviance,
 * null deviance, Pearson χ² and, with a ĉ, QAIC and QAICc (the columns a
 * reviewer of count models reads beside the criteria). Null for a record of
 * least-squares models.
 */
export function modelKindsTable(record: StoredComparisonView): Html | null {
  const models = record.result.models ?? [];
  if (!models.some(hasKindFields)) return null;
  const columns: Column<ModelView>[] = [
    { heading: 'model', cell: (m) => breakableName(m.name), className: 'name' },
    // An expression may be long: it breaks after its operators and spaces, as names do.
    { heading: 'kind', cell: (m) => breakableName(kindInWords(m)), className: 'words' },
  ];
  if (models.some((m) => (m.distributionParameters?.length ?? 0) > 0)) {
    columns.push({ heading: 'distribution parameters (estimate ± standard error)', cell: parametersInWords, className: 'words' });
  }
  if (models.some((m) => m.convergence !== null && m.convergence !== undefined)) {
    columns.push({ heading: 'fit', cell: (m) => convergenceInWords(m.convergence), className: 'words' });
  }
  if (present(models, (m) => m.deviance)) columns.push({ heading: 'deviance', cell: (m) => formatSignificant(m.deviance) });
  if (present(models, (m) => m.devianceExplained)) columns.push({ heading: 'deviance explained', cell: (m) => formatPercent(m.devianceExplained) });
  if (present(models, (m) => m.nullDeviance)) columns.push({ heading: 'null deviance', cell: (m) => formatSignificant(m.nullDeviance) });
  if (present(models, (m) => m.pearsonChiSquare)) columns.push({ heading: 'Pearson χ²', cell: (m) => formatSignificant(m.pearsonChiSquare) });
  if (present(models, (m) => m.qaic)) columns.push({ heading: 'QAIC', cell: (m) => formatFixed(m.qaic, 3) });
  if (present(models, (m) => m.qaicc)) columns.push({ heading: 'QAICc', cell: (m) => formatFixed(m.qaicc, 3) });
  if (present(models, (m) => m.logLikelihoodLogTime)) columns.push({ heading: 'log-likelihood on ln t', cell: (m) => formatFixed(m.logLikelihoodLogTime, 3) });
  const notes = [
    present(models, (m) => m.devianceExplained) ? 'deviance explained: 1 − deviance / null deviance' : null,
    present(models, (m) => m.pearsonChiSquare) ? 'Pearson χ²: Σ (y − μ)² / V(μ), over its residual degrees of freedom an estimate of overdispersion' : null,
    present(models, (m) => m.qaic) ? 'QAIC and QAICc with the ĉ of the rankings, k counting ĉ' : null,
  ].filter((n) => n !== null);
  const caption = notes.length > 0 ? `What each model is (${notes.join('; ')})` : 'What each model is';
  return table(caption, columns, models, (m) => ({ 'data-model': m.name }), { id: 'model-kinds' });
}

const censoringWords: [keyof NonNullable<ModelView['censoring']>, string][] = [
  ['exact', 'exact failures'], ['right', 'right-censored'], ['left', 'left-censored'], ['interval', 'interval-censored'],
];

/** The censoring counts of the life models, one line per distinct set of counts. */
export function censoringLine(record: StoredComparisonView): Html | null {
  const models = record.result.models ?? [];
  const groups = new Map<string, string[]>();
  for (const m of models) {
    if (!m.censoring) continue;
    const words = censoringWords.map(([key, word]) => `${formatCount(m.censoring?.[key] ?? 0)} ${word}`).join(', ');
    groups.set(words, [...(groups.get(words) ?? []), m.name]);
  }
  if (groups.size === 0) return null;
  const life = models.filter((m) => m.censoring).length;
  const lines = [...groups].map(([words, names]) => `${groups.size === 1 && names.length === life ? 'The life models were' : `${whichModels(names, life)}:`} fitted to ${words}.`);
  return tag('p', { class: 'note', 'data-section': 'censoring' }, lines.join(' '));
}

interface PercentileRow { model: string; probability: number | null; estimate: number | null; lower: number | null; upper: number | null }

/** Percentiles of life, with their Wald intervals, for the life models without terms that report them. */
export function percentilesTable(record: StoredComparisonView): Html | null {
  const rows: PercentileRow[] = (record.result.models ?? []).flatMap((m) =>
    (Array.isArray(m.percentiles) ? m.percentiles : []).map((p) => ({ model: m.name, ...p })));
  if (rows.length === 0) return null;
  const columns: Column<PercentileRow>[] = [
    { heading: 'model', cell: (p) => breakableName(p.model), className: 'name' },
    { heading: 'probability of failure', cell: (p) => formatPercent(p.probability) },
    { heading: 'time', cell: (p) => formatSignificant(p.estimate) },
    { heading: 'lower', cell: (p) => formatSignificant(p.lower) },
    { heading: 'upper', cell: (p) => formatSignificant(p.upper) },
  ];
  const level = finiteOrNull(record.result.conventions?.intervalLevel);
  const interval = level === null ? 'its interval' : `its ${formatPercent(level).replace(/\.0%$/, '%')} interval`;
  return table(`Percentiles of life: the time by which that share of units has failed, with ${interval}`, columns, rows, (p) => ({ 'data-model': p.model }), { id: 'percentiles' });
}

/** The ĉ behind the QAIC rankings, in words. */
function overdispersionNote(record: StoredComparisonView): Html | null {
  const o = record.result.overdispersion;
  if (!o || finiteOrNull(o.cHat) === null) return null;
  const from = o.source === 'given' ? 'as given by the caller' : `estimated as Pearson χ² / residual degrees of freedom of ${o.source ?? 'the most general model'}${finiteOrNull(o.df) === null ? '' : ` (${formatCount(o.df)} degrees of freedom)`}`;
  const below = o.belowOne ? ' It is below 1: there is no overdispersion to correct, and ĉ = 1 (the ordinary AIC) is the usual choice then.' : '';
  return tag('p', { class: o.belowOne ? 'note emphasis' : 'note', 'data-section': 'overdispersion' }, `QAIC and QAICc use ĉ = ${formatSignificant(o.cHat, 'n/a', 4)}, ${from}.${below}`);
}

/** Rankings by QAIC and QAICc, when the comparison asked for them (options.overdispersion). */
export function quasiRankingTables(record: StoredComparisonView): Html | null {
  const tables = (['qaic', 'qaicc'] as const).flatMap((key) => ((record.result.rankings?.[key] ?? []).length === 0 ? [] : [rankingTable(record, key)]));
  if (tables.length === 0) return null;
  return fragment(overdispersionNote(record), ...tables);
}
