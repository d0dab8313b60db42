// The data set and the conventions of a stored result, in words for a
// person: each convention under a name of its own, never the JSON key it is
// stored under, and values such as a criterion or a level written as a reader
// would write them. Conventions added later (any key) read through keyInWords.
import { isCriterionName, criterionDisplayName } from './criteria.ts';
import { fragment, tag, type Html } from './html-markup.ts';
import { finiteOrNull, formatCount, formatSignificant } from './number-format.ts';
import { factsList } from './report-table.ts';
import type { StoredComparisonView } from './types.ts';
import { keyInWords } from './words.ts';

const conventionNames: Record<string, string> = {
  version: 'conventions version',
  parameterCount: 'parameters (k)',
  logLikelihood: 'log-likelihood',
  weights: 'weights',
  r2: 'R²',
  commonRows: 'rows used',
  rank: 'aliased columns',
  fittedElsewhere: 'models fitted elsewhere',
  responseTransforms: 'transformed responses',
  rankBy: 'ranked by',
  rankByReason: 'why that criterion',
  confidenceLevel: 'confidence set',
  intervalLevel: 'intervals',
};

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

function conventionValue(key: string, value: unknown, depth = 0): Html | string {
  if (value === null || value === undefined) return 'n/a';
  if (typeof value === 'string') return key === 'rankBy' && isCriterionName(value) ? criterionDisplayName(value) : value;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') {
    if (key === 'confidenceLevel') return `the best models holding ${formatSignificant(value * 100, 'n/a', 3)}% of the weight`;
    if (/level$/i.test(key) && value > 0 && value < 1) return `${formatSignificant(value * 100, 'n/a', 3)}%`;
    return formatSignificant(value);
  }
  if (depth >= 3) return '…';
  if (Array.isArray(value)) return tag('ul', { class: 'tree' }, ...value.map((v) => tag('li', {}, conventionValue(key, v, depth + 1))));
  if (isObject(value)) {
    return tag('ul', { class: 'tree' }, ...Object.entries(value).map(([k, v]) => tag('li', {}, `${conventionNames[k] ?? keyInWords(k)}: `, conventionValue(k, v, depth + 1))));
  }
  return String(value);
}


export function datasetAndConventions(record: StoredComparisonView): Html {
  const d = record.result.dataset ?? {};
  const conventions = Object.entries(record.result.conventions ?? {}).map(([k, v]): [string, Html | string] => [conventionNames[k] ?? keyInWords(k), conventionValue(k, v)]);
  const dropped = finiteOrNull(d.rowsDropped);
  return fragment(
    tag('h2', { id: 'data' }, 'Data set and conventions'),
    factsList([
      ['response', String(d.response ?? 'n/a')],
      ['observations used', formatCount(d.observations)],
      ['rows left out', dropped === null ? 'n/a' : `${formatCount(dropped)}${dropped > 0 ? ' (a missing value in a column some candidate uses)' : ''}`],
      ['fingerprint', tag('span', { class: 'hash' }, String(d.fingerprint ?? 'n/a'))],
    ], { 'data-section': 'dataset' }),
    conventions.length === 0 ? null : factsList(conventions, { 'data-section': 'conventions' }),
    tag('p', { class: 'note' }, 'All candidates were scored on the same rows of the same response under these conventions, so their criteria can be compared.'),
  );
}
