// Residual diagnostics as one table, a row per model and a column per check,
// with each check's note and each caution said once below it (they are the
// same for every model, and a page that repeated them per model would bury
// the numbers). A diagnostics object of another shape falls back to a tree.
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatPValue, formatSignificant } from './number-format.ts';
import { valueTree, whichModels } from './report-extras.ts';
import type { ModelView, StoredComparisonView } from './types.ts';
import { glmChecksTable } from './report-glm-checks.ts';

type Obj = Record<string, unknown>;
const isObject = (v: unknown): v is Obj => v !== null && typeof v === 'object' && !Array.isArray(v);
const part = (d: Obj, key: string): Obj => (isObject(d[key]) ? (d[key] as Obj) : {});

/** The value, and "flagged" when the check did not pass, so the verdict reads without colour. */
function verdictCell(value: string, passed: unknown): Html {
  if (passed === false) return tag('td', { class: 'flagged' }, `${value} · flagged`);
  return tag('td', {}, value);
}

/**
 * Over its own threshold when the record states one; otherwise the check's
 * verdict. A check of two numbers (VIF and condition number) passes or fails
 * as a whole, and flagging both cells would mark a VIF of 1 as trouble.
 */
function overThreshold(value: unknown, threshold: unknown, passed: unknown): boolean | null {
  const x = finiteOrNull(value);
  const limit = finiteOrNull(threshold);
  if (x === null) return null;
  if (limit === null) return passed === false ? false : null;
  return x <= limit;
}

// Screening numbers are read against a threshold: three significant digits say
// all a reader needs (common practice for diagnostic tables).
const screening = (value: unknown): string => formatSignificant(value, 'n/a', 3);

const columns: { heading: string; cell: (d: Obj) => Html }[] = [
  { heading: 'normality p (Jarque–Bera)', cell: (d) => verdictCell(formatPValue(part(d, 'residualNormality').pValue), part(d, 'residualNormality').passed) },
  { heading: 'constant variance p (Breusch–Pagan)', cell: (d) => verdictCell(formatPValue(part(d, 'heteroscedasticity').pValue), part(d, 'heteroscedasticity').passed) },
  { heading: 'Durbin–Watson', cell: (d) => verdictCell(screening(part(d, 'autocorrelation').statistic), part(d, 'autocorrelation').passed) },
  {
    heading: 'largest VIF',
    cell: (d) => {
      const m = part(d, 'multicollinearity');
      return verdictCell(screening(m.maxVarianceInflation), overThreshold(m.maxVarianceInflation, m.varianceInflationThreshold, m.passed));
    },
  },
  {
    heading: 'condition number',
    cell: (d) => {
      const m = part(d, 'multicollinearity');
      return verdictCell(screening(m.conditionNumber), overThreshold(m.conditionNumber, m.conditionNumberThreshold, m.passed));
    },
  },
  {
    heading: "largest Cook's distance",
    cell: (d) => {
      const i = part(d, 'influence');
      return verdictCell(screening(i.maxCooksDistance), overThreshold(i.maxCooksDistance, i.cooksDistanceThreshold, i.passed));
    },
  },
  {
    heading: 'high-leverage rows',
    cell: (d) => {
      const rows = finiteOrNull(part(d, 'influence').highLeverageRows);
      return verdictCell(rows === null ? 'n/a' : String(rows), rows === null ? null : rows === 0);
    },
  },
];

/** The checks this table knows; anything else is shown as a tree. */
function isKnownShape(d: unknown): d is Obj {
  return isObject(d) && typeof d.available === 'boolean' && ['residualNormality', 'heteroscedasticity', 'autocorrelation', 'multicollinearity', 'influence'].every((k) => k in d);
}

function thresholds(models: [ModelView, Obj][]): string | null {
  const first = models.find(([, d]) => d.available === true)?.[1];
  if (!first) return null;
  const alpha = finiteOrNull(part(first, 'residualNormality').alpha);
  const range = part(first, 'autocorrelation').acceptableRange;
  const m = part(first, 'multicollinearity');
  const i = part(first, 'influence');
  const facts = [
    alpha === null ? null : `p below ${formatSignificant(alpha)} is flagged`,
    Array.isArray(range) && range.length === 2 ? `Durbin–Watson outside ${formatSignificant(range[0])} to ${formatSignificant(range[1])}` : null,
    `VIF over ${formatSignificant(m.varianceInflationThreshold)} or condition number over ${formatSignificant(m.conditionNumberThreshold)}`,
    `Cook's distance over ${formatSignificant(i.cooksDistanceThreshold)}`,
  ].filter((f): f is string => f !== null);
  return `Flagged when: ${facts.join('; ')}. High-leverage rows are counted against 2p/n.`;
}

/**
 * Each distinct sentence once, with the models it was said of ("every model"
 * when said of all `of` models). What is said of every model comes first, so
 * it does not sit between two findings about one model.
 */
function saidOnce(items: [string, string][], of: number): Html[] {
  const byText = new Map<string, string[]>();
  for (const [model, text] of items) byText.set(text, [...(byText.get(text) ?? []), model]);
  const ofAll = (models: string[]): boolean => models.length === of && of > 1;
  const ordered = [...byText].sort(([, a], [, b]) => Number(ofAll(b)) - Number(ofAll(a)));
  return ordered.map(([text, models]) => tag('li', {}, tag('strong', {}, `${whichModels(models, of)}: `), text));
}

export function diagnosticsSection(record: StoredComparisonView): Html | null {
  const models = (record.result.models ?? []).filter((m) => m.diagnostics !== undefined && m.diagnostics !== null);
  if (models.length === 0) return null;
  const known = models.filter((m) => isKnownShape(m.diagnostics)).map((m): [ModelView, Obj] => [m, m.diagnostics as Obj]);
  const other = models.filter((m) => !isKnownShape(m.diagnostics));

  const rows = known.map(([m, d]) =>
    d.available === true
      ? tag('tr', { 'data-model': m.name }, tag('td', { class: 'name' }, m.name), ...columns.map((c) => c.cell(d)))
      : tag('tr', { 'data-model': m.name }, tag('td', { class: 'name' }, m.name), tag('td', { colspan: String(columns.length), class: 'words' }, `not available: ${String(d.reason ?? 'no reason given')}`)),
  );
  const notes: [string, string][] = known.flatMap(([m, d]) =>
    ['residualNormality', 'heteroscedasticity', 'autocorrelation', 'multicollinearity']
      .map((k) => part(d, k).note)
      .filter((n): n is string => typeof n === 'string' && n !== '')
      .map((n): [string, string] => [m.name, n]));
  const cautions: [string, string][] = known.flatMap(([m, d]) =>
    (Array.isArray(d.cautions) ? d.cautions : []).filter((c): c is string => typeof c === 'string').map((c): [string, string] => [m.name, c]));
  const rule = thresholds(known);

  return fragment(
    tag('h2', { id: 'diagnostics' }, 'Diagnostics'),
    tag('p', { class: 'note' }, 'Checks of each fitted model\'s residuals and design. They screen for trouble; passing them does not make a model valid.'),
    known.length === 0 ? null : tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'diagnostics' },
      tag('thead', {}, tag('tr', {}, tag('th', { scope: 'col', class: 'name' }, 'model'), ...columns.map((c) => tag('th', { scope: 'col' }, c.heading)))),
      tag('tbody', {}, ...rows),
    )),
    rule === null ? null : tag('p', { class: 'note' }, rule),
    glmChecksTable(known.map(([m]) => m)),
    notes.length === 0 ? null : fragment(tag('h3', {}, 'About the checks'), tag('ul', { class: 'cautions', 'data-section': 'diagnostic-notes' }, ...[...new Set(notes.map(([, n]) => n))].map((n) => tag('li', {}, n)))),
    cautions.length === 0 ? null : fragment(tag('h3', {}, 'What the checks found'), tag('ul', { class: 'cautions', 'data-section': 'diagnostic-cautions' }, ...saidOnce(cautions, known.length))),
    ...other.map((m) => tag('section', { class: 'diagnostics', 'data-model': m.name }, tag('h3', {}, m.name), valueTree(m.diagnostics))),
  );
}
