// Parts of the report that appear only when the record has them: nested
// tests and averaged estimates (diagnostics: report-diagnostics.ts); and the cautions, which always
// appear because one of them stands for every comparison.
import { firstRows, leftOutNote, REPORT_ROW_LIMITS } from './bounded-rows.ts';
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatPValue, formatSignificant } from './number-format.ts';
import type { CautionView, StoredComparisonView } from './types.ts';

/** Said on every report, whatever the numbers: the service's own limits. */
export const standingCaution =
  'These criteria rank the candidate models against one another on this data set. They do not show that any of them is valid, adequate or safe for its intended use. Where a decision could affect safety, health or compliance, defer to review by people who know the process and to the rules that apply locally.';

/**
 * Any JSON value as nested lists, for parts whose shape the renderer does not
 * know in detail (diagnostics, predictions). Depth and length are capped so a
 * large record still gives a readable page.
 */
export function valueTree(value: unknown, depth = 0): Html {
  if (value === null || value === undefined) return tag('span', {}, 'n/a');
  if (typeof value === 'number') return tag('span', {}, formatSignificant(value));
  if (typeof value === 'boolean') return tag('span', {}, value ? 'yes' : 'no');
  if (typeof value === 'string') return tag('span', {}, value);
  if (depth >= 4) return tag('span', {}, '…');
  if (Array.isArray(value)) {
    const shown = value.slice(0, 25);
    const more = value.length - shown.length;
    if (shown.every((v) => v === null || typeof v !== 'object')) {
      const words = shown.map((v) => (typeof v === 'number' ? formatSignificant(v) : v === null ? 'n/a' : String(v)));
      return tag('span', {}, words.join(', ') + (more > 0 ? `, … and ${more} more` : ''));
    }
    return tag('ul', { class: 'tree' }, ...shown.map((v) => tag('li', {}, valueTree(v, depth + 1))), more > 0 ? tag('li', {}, `… and ${more} more`) : null);
  }
  const entries = Object.entries(value as Record<string, unknown>);
  return tag('ul', { class: 'tree' }, ...entries.map(([key, v]) => tag('li', {}, tag('strong', {}, key), ': ', valueTree(v, depth + 1))));
}

function degreesOfFreedom(df: unknown): string {
  if (Array.isArray(df)) return df.map((d) => formatSignificant(d)).join(', ');
  if (df !== null && typeof df === 'object') return Object.entries(df).map(([k, v]) => `${k} ${formatSignificant(v)}`).join(', ');
  return formatSignificant(df);
}

export function nestedTestsSection(record: StoredComparisonView): Html | null {
  const tests = record.result.nestedTests;
  if (!Array.isArray(tests) || tests.length === 0) return null;
  const headings = ['smaller model', 'larger model', 'df', 'F', 'p (F)', 'likelihood ratio', 'p (LR)'];
  return fragment(
    tag('h2', { id: 'nested' }, 'Nested tests'),
    tag('p', { class: 'note' }, 'Each pair is a smaller model contained in a larger one; a small p says the extra terms explain more than chance would.'),
    tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'nested-tests' },
      tag('thead', {}, tag('tr', {}, ...headings.map((h, i) => tag('th', { scope: 'col', class: i < 2 ? 'name' : null }, h)))),
      tag('tbody', {}, ...tests.map((t) => tag('tr', { 'data-smaller': String(t.smaller), 'data-larger': String(t.larger) },
        tag('td', { class: 'name' }, String(t.smaller)),
        tag('td', { class: 'name' }, String(t.larger)),
        tag('td', {}, degreesOfFreedom(t.df)),
        tag('td', {}, formatSignificant(t.fStatistic)),
        tag('td', {}, formatPValue(t.fPValue)),
        tag('td', {}, formatSignificant(t.lrStatistic)),
        tag('td', {}, formatPValue(t.lrPValue)),
      ))),
    )),
  );
}

function predictionsTable(predictions: unknown[], recordId: string): Html {
  const { shown, total } = firstRows(predictions, REPORT_ROW_LIMITS.averagedPredictions);
  const rows = shown.filter((p): p is Record<string, unknown> => p !== null && typeof p === 'object' && !Array.isArray(p));
  const keys = [...new Set(rows.flatMap((r) => Object.keys(r)))];
  return fragment(
    tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'averaged-predictions' },
      tag('caption', {}, 'Averaged predictions'),
      tag('thead', {}, tag('tr', {}, tag('th', { scope: 'col' }, 'row'), ...keys.map((k) => tag('th', { scope: 'col' }, k)))),
      tag('tbody', {}, ...rows.map((r, i) => tag('tr', {}, tag('td', {}, String(i + 1)), ...keys.map((k) => tag('td', {}, valueTree(r[k], 3)))))),
    )),
    leftOutNote(shown.length, total, 'averaged predictions', recordId),
  );
}

export function averagedSection(record: StoredComparisonView): Html | null {
  const averaged = record.result.averaged;
  const allTerms = averaged?.terms ?? [];
  const predictions = averaged?.predictions ?? [];
  if (allTerms.length === 0 && predictions.length === 0) return null;
  const { shown: terms, total: termCount } = firstRows(allTerms, REPORT_ROW_LIMITS.averagedTerms);
  return fragment(
    tag('h2', { id: 'averaged' }, 'Averaged estimates'),
    tag('p', { class: 'note' }, 'Estimates averaged over the candidates with their weights; the unconditional standard error includes the uncertainty of which model is right.'),
    terms.length === 0 ? null : tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'averaged-terms' },
      tag('thead', {}, tag('tr', {}, ...['term', 'estimate', 'unconditional standard error', 'importance'].map((h, i) => tag('th', { scope: 'col', class: i === 0 ? 'name' : null }, h)))),
      tag('tbody', {}, ...terms.map((t) => tag('tr', { 'data-term': String(t.term) },
        tag('td', { class: 'name' }, String(t.term)),
        tag('td', {}, formatSignificant(t.estimate)),
        tag('td', {}, formatSignificant(t.unconditionalStandardError)),
        tag('td', {}, finiteOrNull(t.importance) === null ? 'n/a' : formatSignificant(t.importance)),
      ))),
    )),
    leftOutNote(terms.length, termCount, 'averaged terms', record.id),
    predictions.length === 0 ? null : predictionsTable(predictions, record.id),
  );
}

/** The facts of a caution on one line: "rows 3; parameters 5". */
function inlineFacts(facts: Record<string, unknown>): string {
  return Object.entries(facts)
    .map(([key, v]) => `${key} ${typeof v === 'number' ? formatSignificant(v) : typeof v === 'string' ? v : JSON.stringify(v)}`)
    .join('; ');
}

function cautionItem(caution: CautionView, about: string | null): Html {
  const prefix = about === null ? null : tag('strong', {}, `${about}: `);
  if (typeof caution === 'string') return tag('li', {}, prefix, caution);
  const { message, code, ...facts } = caution ?? {};
  const words = typeof message === 'string' && message !== '' ? message : typeof code === 'string' ? code : 'caution';
  const detail = Object.keys(facts).length === 0 ? null : tag('span', { class: 'facts-inline' }, ` (${inlineFacts(facts)})`);
  return tag('li', { 'data-code': typeof code === 'string' ? code : null }, prefix, words, detail);
}

export function cautionsSection(record: StoredComparisonView): Html {
  const items: Html[] = [];
  for (const c of record.result.cautions ?? []) items.push(cautionItem(c, null));
  for (const m of record.result.models ?? []) for (const c of m.cautions ?? []) items.push(cautionItem(c, m.name));
  return fragment(
    tag('h2', { id: 'cautions' }, 'Cautions'),
    tag('p', { class: 'standing', 'data-caution': 'standing' }, standingCaution),
    items.length === 0 ? tag('p', { class: 'note' }, 'No further cautions for this comparison.') : tag('ul', { class: 'cautions' }, ...items),
  );
}
