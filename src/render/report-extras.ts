// Parts of the report that appear only when the record has them: nested
// tests and averaged estimates (diagnostics: report-diagnostics.ts); and the cautions, which always
// appear because one of them stands for every comparison.
import { firstRows, leftOutNote, REPORT_ROW_LIMITS } from './bounded-rows.ts';
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatPercent, formatPValue, formatSignificant } from './number-format.ts';
import { predictionTable } from './report-coefficients.ts';
import { breakableName } from './report-table.ts';
import type { CautionView, StoredComparisonView } from './types.ts';
import { keyInWords } from './words.ts';

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
    nestedReasons(tests),
  );
}

/**
 * What the record says of a test beyond its numbers — why a statistic is
 * missing, which restriction a life-model test is of, or that a pair with an
 * expression was taken as nested on the caller's word — once per distinct
 * sentence, with the pairs it is said of.
 */
function nestedReasons(tests: NonNullable<StoredComparisonView['result']['nestedTests']>): Html | null {
  const pairs = new Map<string, string[]>();
  for (const t of tests) {
    if (typeof t.reason !== 'string' || t.reason === '') continue;
    pairs.set(t.reason, [...(pairs.get(t.reason) ?? []), `${t.smaller} inside ${t.larger}`]);
  }
  if (pairs.size === 0) return null;
  return tag('ul', { class: 'note', 'data-section': 'nested-reasons' },
    ...[...pairs].map(([reason, names]) => tag('li', {}, `${names.join(', ')}: ${reason}`)));
}

/** Which models the coefficients were averaged over, and their weight, when the record says. */
function averagedOver(averaged: NonNullable<StoredComparisonView['result']['averaged']>): Html | null {
  const models = Array.isArray(averaged.models) ? averaged.models.map(String) : [];
  const covered = finiteOrNull(averaged.weightCovered);
  if (models.length === 0 && covered === null) return null;
  const over = models.length === 0 ? 'Coefficients averaged over the models on one response scale' : `Coefficients averaged over ${models.join(', ')}`;
  const weight = covered === null ? '' : `, which hold ${formatPercent(covered)} of the weight`;
  const short = covered !== null && covered < 1 ? '; the other models (another response scale) are left out of the coefficients, not of the predictions' : '';
  return tag('p', { class: covered !== null && covered < 1 ? 'note emphasis' : 'note', 'data-section': 'averaged-over' }, `${over}${weight}${short}.`);
}

export function averagedSection(record: StoredComparisonView): Html | null {
  const averaged = record.result.averaged;
  const allTerms = averaged?.terms ?? [];
  const predictions = averaged?.predictions ?? [];
  if (!averaged || (allTerms.length === 0 && predictions.length === 0)) return null;
  const { shown: terms, total: termCount } = firstRows(allTerms, REPORT_ROW_LIMITS.averagedTerms);
  return fragment(
    tag('h2', { id: 'averaged' }, 'Averaged estimates'),
    tag('p', { class: 'note' }, 'Estimates averaged over the candidates with their weights; the unconditional standard error includes the uncertainty of which model is right.'),
    averagedOver(averaged),
    terms.length === 0 ? null : tag('div', { class: 'table-wrap' }, tag('table', { 'data-section': 'averaged-terms' },
      tag('thead', {}, tag('tr', {}, ...['term', 'estimate', 'unconditional standard error', 'importance'].map((h, i) => tag('th', { scope: 'col', class: i === 0 ? 'name' : null }, h)))),
      tag('tbody', {}, ...terms.map((t) => tag('tr', { 'data-term': String(t.term) },
        tag('td', { class: 'name' }, breakableName(t.term)),
        tag('td', {}, formatSignificant(t.estimate)),
        tag('td', {}, formatSignificant(t.unconditionalStandardError)),
        tag('td', {}, finiteOrNull(t.importance) === null ? 'n/a' : formatSignificant(t.importance, 'n/a', 3)),
      ))),
    )),
    leftOutNote(terms.length, termCount, 'averaged terms', record.id),
    predictions.length === 0 ? null : predictionTable(record, predictions, 'Averaged predictions', 'averaged predictions', { 'data-section': 'averaged-predictions' }),
  );
}

/** The facts of a caution on one line, in words: "rows dropped 3; parameters 5". */
function inlineFacts(facts: Record<string, unknown>): string {
  return Object.entries(facts)
    .map(([key, v]) => `${keyInWords(key)} ${typeof v === 'number' ? formatSignificant(v) : typeof v === 'string' ? v : JSON.stringify(v)}`)
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

const cautionText = (c: CautionView): string => (typeof c === 'string' ? c : typeof c?.message === 'string' ? c.message : '');

/** The cautions the diagnostics table already lists for a model ("What the checks found"). */
function diagnosticFindings(diagnostics: unknown): Set<string> {
  const cautions = diagnostics !== null && typeof diagnostics === 'object' ? (diagnostics as { cautions?: unknown }).cautions : undefined;
  return new Set(Array.isArray(cautions) ? cautions.filter((c): c is string => typeof c === 'string') : []);
}

/** "every model", or the models' names. */
export function whichModels(names: string[], all: number): string {
  return names.length === all && all > 1 ? 'every model' : names.join(', ');
}

/**
 * The standing caution, then the record's own cautions and each model's, every
 * finding said once: a caution said of several models is one item naming them,
 * the findings the diagnostics section lists are not repeated here, and the
 * record's "ranking is not validation" caution is the standing one.
 */
export function cautionsSection(record: StoredComparisonView): Html {
  const items: Html[] = [];
  for (const c of record.result.cautions ?? []) {
    if (typeof c === 'object' && c?.code === 'ranking_is_not_validation') continue;
    items.push(cautionItem(c, null));
  }
  const models = record.result.models ?? [];
  const grouped = new Map<string, { caution: CautionView; models: string[] }>();
  let listedUnderDiagnostics = 0;
  for (const m of models) {
    const findings = diagnosticFindings(m.diagnostics);
    for (const c of m.cautions ?? []) {
      if (findings.has(cautionText(c))) {
        listedUnderDiagnostics += 1;
        continue;
      }
      const key = JSON.stringify(c);
      const group = grouped.get(key) ?? { caution: c, models: [] };
      if (!group.models.includes(m.name)) group.models.push(m.name);
      grouped.set(key, group);
    }
  }
  for (const { caution, models: names } of grouped.values()) items.push(cautionItem(caution, whichModels(names, models.length)));
  return fragment(
    tag('h2', { id: 'cautions' }, 'Cautions'),
    tag('p', { class: 'standing', 'data-caution': 'standing' }, standingCaution),
    items.length === 0 ? tag('p', { class: 'note' }, 'No further cautions for this comparison.') : tag('ul', { class: 'cautions' }, ...items),
    listedUnderDiagnostics === 0 ? null : tag('p', { class: 'note' }, 'The findings of the residual and design checks are listed once, under Diagnostics.'),
  );
}
