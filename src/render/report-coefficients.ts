// Each model's coefficients and predictions, and the averaged predictions.
// Inference fields (t, p, intervals) and interval bounds of predictions are
// shown when the record has them; records written before they existed show
// estimates and standard errors only. Long lists of prediction rows are cut to
// a bounded number, and the page says how many it left out.
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatCount, formatPValue, formatSignificant } from './number-format.ts';
import { breakableName, table, type Column } from './report-table.ts';
import type { CoefficientView, StoredComparisonView } from './types.ts';
import { firstRows, leftOutNote, REPORT_ROW_LIMITS } from './bounded-rows.ts';

/** Prediction rows shown per table; the rest stay in the record. */
export const PREDICTION_ROWS_SHOWN = REPORT_ROW_LIMITS.averagedPredictions;

type Row = Record<string, unknown>;
const isObject = (v: unknown): v is Row => v !== null && typeof v === 'object' && !Array.isArray(v);
const has = (rows: readonly Row[], key: string) => rows.some((r) => finiteOrNull(r[key]) !== null);

/** "[a, b]" from two bounds, "n/a" when either is missing. */
function interval(lower: unknown, upper: unknown): string {
  const a = finiteOrNull(lower);
  const b = finiteOrNull(upper);
  return a === null || b === null ? 'n/a' : `[${formatSignificant(a)}, ${formatSignificant(b)}]`;
}

/** "95% interval" when the record states its level, else "interval". */
function intervalHeading(record: StoredComparisonView, what: string): string {
  const level = finiteOrNull(record.result.conventions?.intervalLevel);
  return level === null ? what : `${formatSignificant(level * 100, 'n/a', 3)}% ${what}`;
}

function coefficientTable(record: StoredComparisonView, rows: CoefficientView[]): Html {
  const columns: Column<CoefficientView>[] = [
    { heading: 'term', cell: (c) => breakableName(c.term), className: 'name' },
    { heading: 'estimate', cell: (c) => formatSignificant(c.estimate) },
    { heading: 'standard error', cell: (c) => formatSignificant(c.standardError) },
  ];
  if (has(rows, 'tStatistic')) columns.push({ heading: 't', cell: (c) => formatSignificant(c.tStatistic, 'n/a', 4) });
  if (has(rows, 'pValue')) columns.push({ heading: 'p', cell: (c) => formatPValue(c.pValue) });
  if (has(rows, 'lower') || has(rows, 'upper')) columns.push({ heading: intervalHeading(record, 'confidence interval'), cell: (c) => interval(c.lower, c.upper) });
  return table(null, columns, rows, () => ({}));
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
        tag('h3', {}, breakableName(m.name)),
        rows.total === 0 ? tag('p', { class: 'note' }, 'No coefficients: this candidate was fitted elsewhere.') : coefficientTable(record, rows.shown),
        leftOutNote(rows.shown.length, rows.total, 'coefficients', record.id),
        aliased.total === 0 ? null : tag('p', { class: 'note' }, `Aliased (not estimable from these data, left out of k): ${aliased.shown.join(', ')}${moreAliased}`),
      );
    }),
  );
}

const knownPredictionFields = new Set(['estimate', 'standardError', 'lower', 'upper', 'predictionLower', 'predictionUpper']);

/** Prediction rows of one model or of the average: estimate, standard error, the intervals the record has, then any other plain field. */
export function predictionTable(record: StoredComparisonView, predictions: readonly unknown[], caption: string, what: string, attrs: Record<string, string>): Html {
  const all = predictions.filter(isObject);
  const rows: Row[] = all.slice(0, PREDICTION_ROWS_SHOWN).map((r, i) => ({ ...r, '#': i + 1 }));
  const columns: Column<Row>[] = [
    { heading: 'row', cell: (r) => String(r['#']) },
    { heading: 'estimate', cell: (r) => formatSignificant(r.estimate) },
    { heading: 'standard error', cell: (r) => formatSignificant(r.standardError) },
  ];
  if (has(rows, 'lower') || has(rows, 'upper')) columns.push({ heading: intervalHeading(record, 'interval for the mean'), cell: (r) => interval(r.lower, r.upper) });
  if (has(rows, 'predictionLower') || has(rows, 'predictionUpper')) {
    columns.push({ heading: intervalHeading(record, 'interval for a new observation'), cell: (r) => interval(r.predictionLower, r.predictionUpper) });
  }
  const others = [...new Set(rows.flatMap((r) => Object.keys(r)))].filter((k) => k !== '#' && !knownPredictionFields.has(k) && rows.every((r) => r[k] === undefined || r[k] === null || typeof r[k] !== 'object'));
  for (const key of others) columns.push({ heading: key, cell: (r) => (typeof r[key] === 'number' ? formatSignificant(r[key]) : String(r[key] ?? '')), className: 'words' });
  return fragment(
    table(caption, columns, rows, () => ({}), attrs),
    leftOutNote(rows.length, all.length, what, record.id),
  );
}

export function predictionsSection(record: StoredComparisonView): Html | null {
  const models = (record.result.models ?? []).filter((m) => Array.isArray(m.predictions) && m.predictions.length > 0);
  if (models.length === 0) return null;
  return fragment(
    tag('h2', { id: 'predictions' }, 'Predictions'),
    tag('p', { class: 'note' }, 'Each model\'s estimate of the response at the rows asked for, in request order.'),
    ...models.map((m) => tag('section', { class: 'predictions', 'data-model': m.name },
      tag('h3', {}, breakableName(m.name)),
      predictionTable(record, m.predictions ?? [], `Predictions of ${m.name}`, 'prediction rows', { 'data-section': 'predictions' }))),
  );
}
