// What can go wrong with a request, as data. The core never throws for
// anything a caller sent: it returns issues, each a code, a path into the
// request (e.g. ['candidates', 2, 'terms', 0]) and the facts behind it. The
// HTTP layer maps every issue to a 422 problem detail; the message is a plain
// sentence that names the field, written here once so all callers read the
// same words.

import { isMissingMarker, readsAsNumber } from './design/text-values.ts';
import { KIND_MESSAGES, type KindIssueFacts } from './issue-kinds.ts';
import { quoteList } from './issue-words.ts';

export type IssuePath = (string | number)[];

/** The facts each issue code carries, besides its path and message. */
export interface IssueFacts extends KindIssueFacts {
  no_candidates: Record<string, never>;
  duplicate_name: { name: string; first: number };
  /** available: the data's columns (at most 20 listed); suggestion: a near match, if any. */
  unknown_column: { column: string; available: string[]; columns: number; suggestion: string | null };
  /** A text column whose values all read as numbers, used where a number or a factor declaration belongs. */
  numbers_as_text: { column: string; example: string; missingMarkers: string[] };
  column_length_mismatch: { column: string; length: number; expected: number };
  column_mixed_types: { column: string; row: number };
  value_not_finite: { column: string; row: number };
  /** A used row holds null although common rows should have dropped it. */
  // predictionRow: the row is one of options.predict's new rows, which no model was fitted on.
  value_missing: { column: string; row: number; predictionRow?: boolean };
  response_not_numeric: { column: string; row: number; value: string };
  response_constant: { column: string; value: number; rows: number };
  weights_not_numeric: { column: string; row: number; value: string };
  weights_not_positive: { column: string; row: number; value: number | null };
  term_form_unknown: Record<string, never>;
  term_not_numeric: { column: string; form: 'power' | 'transform' };
  power_degree_invalid: { column: string; degree: number };
  product_of_one_column: { columns: string[] };
  product_repeated_column: { column: string };
  factor_level_unknown: { column: string; level: string; levels: string[] };
  factor_one_level: { column: string; levels: string[] };
  factor_reference_conflict: { column: string; references: [string, string] };
  transform_domain: { column: string; fn: 'log' | 'sqrt' | 'reciprocal'; row: number; value: number };
  design_value_not_finite: { label: string; row: number };
  duplicate_term: { label: string; first: number };
  all_rows_dropped: { rows: number; dropped: number };
  too_few_rows: { rows: number; parameters: number };
  observations_mismatch: { observations: number; expected: number; against: string };
  residuals_count_mismatch: { residuals: number; rows: number; dataRows: number };
  /** row: the first; rows: up to 20 of them, count: all. */
  residual_at_dropped_row: { row: number; rows: number[]; count: number };
  residual_missing: { row: number };
  estimation_mixed: { reml: string[]; ml: string[] };
  reml_fixed_effects_missing: { name: string };
  reml_fixed_effects_differ: { name: string; fixedEffects: string[]; first: string; firstFixedEffects: string[] };
  response_transform_domain: { fn: 'log' | 'sqrt' | 'boxcox'; row: number; value: number };
  data_required: { form: string };
  fingerprint_mismatch: { expected: string; actual: string | null };
  /** The request's estimated work (multiply-adds) is over its cap; `largest` names the biggest part, `remedy` what to change. */
  work_limit: { estimate: number; limit: number; setting: string; unit: string; largest: string; remedy: string };
  /** The request's estimated working memory (bytes) is over its cap. */
  memory_limit: { estimate: number; limit: number; setting: string; unit: string; largest: string; remedy: string };
  /** The answer (and so the audit record) would be, or is, larger than its cap; measured: the size of the computed answer, not an estimate. */
  result_size_limit: { estimate: number; limit: number; setting: string; unit: string; measured: boolean; largest: string; remedy: string };
  /** One model's design would have more columns than the hard cap (counted from the terms, before any is built; `columns` is a lower bound when a level count stopped past the cap). */
  design_columns_limit: { columns: number; limit: number; setting: string; what: string };
  summary_rows_invalid: { rows: number | null };
  summary_columns_invalid: { column: string };
  summary_size_mismatch: { length: number; expected: number };
  summary_value_not_finite: { column: string };
  summary_not_symmetric: { row: number; column: number };
  summary_negative_variance: { column: string; value: number };
  summary_not_positive_semidefinite: { column: string };
  summary_weights_invalid: { sum: number | null; sumLog: number | null };
  summary_columns_differ: { first: string[]; second: string[] };
  summary_weighting_differs: { firstWeighted: string; secondWeighted: string };
  summary_column_unknown: { column: string };
  /** A term or candidate form that needs the rows, sent with a data summary. */
  summary_rows_needed: { form: string; reason: string };
  search_over_budget: { budget: string; limit: number; required: number; poolTerms: number };
  /** A search term whose design columns depend on which other pool terms are in the subset (a factor declaration elsewhere in the pool). */
  search_coding_varies: { label: string; column: string; declaredBy: string };
  /** With hierarchy, an always term needs a lower-order term that is not in always. */
  hierarchy_always_incomplete: { label: string; needs: string; inPool: boolean };
  nested_test_invalid: { reason: string };
  prediction_column_missing: { column: string; sent: string[] };
  prediction_level_unknown: { column: string; level: string; levels: string[] };
  prediction_weight_invalid: { column: string; row: number; value: string | number | null };
}

export type IssueCode = keyof IssueFacts;

export type Issue = {
  [C in IssueCode]: { code: C; path: IssuePath; message: string } & IssueFacts[C];
}[IssueCode];

/** The path as the problem-details `errors[].path` form: "candidates/2/terms/0". */
export function issuePointer(path: IssuePath): string {
  return path.map(String).join('/');
}

const DOMAIN_RULE = { log: 'greater than 0', sqrt: '0 or more', reciprocal: 'not 0' } as const;

/** A large count as people read it: 31000000000 -> "3.1e10". */
function roughly(value: number): string {
  return value < 1e5 ? String(Math.round(value)) : value.toExponential(1).replace('e+', 'e');
}

function mebibytes(bytes: number): string {
  return `${(bytes / 2 ** 20).toFixed(bytes < 2 ** 20 ? 3 : 1)} MiB`;
}


/** Advice for a text value where a number belongs. */
function textAdvice(value: string): string {
  if (isMissingMarker(value)) return ' — use null for a missing value';
  if (readsAsNumber(value)) return ' — send numbers as JSON numbers, not as text';
  return '';
}

const MESSAGES: { [C in IssueCode]: (f: IssueFacts[C], at: string) => string } = {
  ...KIND_MESSAGES,
  no_candidates: (_f, at) => `${at} lists no candidate models; give at least one.`,
  duplicate_name: (f, at) =>
    `${at} repeats the name ${JSON.stringify(f.name)} already used by candidate ${f.first}; names must be unique.`,
  unknown_column: (f, at) =>
    `${at} refers to column ${JSON.stringify(f.column)}, which the data does not have${f.suggestion === null ? '.' : `; did you mean ${JSON.stringify(f.suggestion)}?`} The data's columns: ${quoteList(f.available)}${f.columns > f.available.length ? ` and ${f.columns - f.available.length} more` : ''}.`,
  numbers_as_text: (f, at) =>
    `${at} uses column ${JSON.stringify(f.column)}, whose values are all numbers written as text (e.g. ${JSON.stringify(f.example)})${f.missingMarkers.length > 0 ? ` or missing-value markers (${quoteList(f.missingMarkers)})` : ''}; as text it would become a factor with a level per distinct value. Send the values as JSON numbers${f.missingMarkers.length > 0 ? ' with null for a missing value' : ''}, or, if they are category codes, declare the column { "kind": "factor", "of": ${JSON.stringify(f.column)} }.`,
  column_length_mismatch: (f, at) =>
    `${at} has ${f.length} values but the other columns have ${f.expected}; all columns must be the same length.`,
  column_mixed_types: (f, at) =>
    `${at} mixes numbers and strings (first at row ${f.row}); a column is either numeric or categorical.`,
  value_not_finite: (f, at) => `${at} holds a value at row ${f.row} that is not a finite number.`,
  value_missing: (f, at) =>
    f.predictionRow
      ? `${at} is missing a value at prediction row ${f.row}; every column a fitted candidate uses needs a value at every row to predict.`
      : `${at} is missing a value at row ${f.row}, a row the comparison uses.`,
  response_not_numeric: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which holds the string ${JSON.stringify(f.value)} at row ${f.row}; the response must be numeric${textAdvice(f.value)}.`,
  response_constant: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which is constant (${f.value}) on all ${f.rows} rows used; there is nothing to explain.`,
  weights_not_numeric: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which holds the string ${JSON.stringify(f.value)} at row ${f.row}; weights must be numbers${textAdvice(f.value)}.`,
  weights_not_positive: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, whose value at row ${f.row} is ${f.value === null ? 'missing' : f.value}; weights must be positive (0 leaves a row out; a negative weight has no meaning).`,
  term_form_unknown: (_f, at) => `${at} is not one of the term forms: a column name, power, product, transform or factor.`,
  term_not_numeric: (f, at) =>
    `${at} takes a ${f.form} of column ${JSON.stringify(f.column)}, which is categorical; a ${f.form} needs a numeric column.`,
  power_degree_invalid: (f, at) =>
    `${at} asks for degree ${f.degree} of column ${JSON.stringify(f.column)}; the degree must be an integer of 2 or more.`,
  product_of_one_column: (f, at) =>
    `${at} is a product of ${f.columns.length === 0 ? 'no columns' : `one column (${quoteList(f.columns)})`}; a product needs two or more different columns.`,
  product_repeated_column: (f, at) =>
    `${at} repeats column ${JSON.stringify(f.column)} in a product; use a power term for a column times itself.`,
  factor_level_unknown: (f, at) =>
    `${at} names reference level ${JSON.stringify(f.level)} of column ${JSON.stringify(f.column)}, which is not among the levels on the rows used (${quoteList(f.levels)}).`,
  factor_one_level: (f, at) =>
    `${at} uses column ${JSON.stringify(f.column)} as a factor, but the rows used hold ${f.levels.length === 0 ? 'no level' : `only the level ${quoteList(f.levels)}`}; a factor needs two or more levels.`,
  factor_reference_conflict: (f, at) =>
    `${at} sets reference level ${JSON.stringify(f.references[1])} for column ${JSON.stringify(f.column)}, but the same candidate already set ${JSON.stringify(f.references[0])}.`,
  transform_domain: (f, at) =>
    `${at} takes ${f.fn} of column ${JSON.stringify(f.column)}, whose value at row ${f.row} is ${f.value}; ${f.fn} needs values ${DOMAIN_RULE[f.fn]}.`,
  design_value_not_finite: (f, at) =>
    `${at} gives design column ${JSON.stringify(f.label)} a value at row ${f.row} too large for a double.`,
  duplicate_term: (f, at) =>
    f.first < 0
      ? `${at} produces design column ${JSON.stringify(f.label)}, the label of the model's intercept; rename the data column, or set intercept to false.`
      : `${at} produces design column ${JSON.stringify(f.label)}, which term ${f.first} of the same candidate already produces (the order of a product's columns does not matter).`,
  all_rows_dropped: (f, at) =>
    `${at}: every one of the ${f.rows} rows has a missing value (or a zero weight) in a column some candidate uses, so no rows are left.`,
  too_few_rows: (f, at) =>
    `${at} has ${f.parameters} coefficients to estimate from ${f.rows} rows; a model needs at least as many rows as coefficients (and more for any criterion to exist).`,
  observations_mismatch: (f, at) =>
    `${at} states ${f.observations} observations, but ${f.against} ${f.expected}; models must be compared on the same rows.`,
  residuals_count_mismatch: (f, at) =>
    `${at} has ${f.residuals} residuals; send one per row the comparison uses (${f.rows}) or one per data row (${f.dataRows}) with null where a row is dropped.`,
  residual_at_dropped_row: (f, at) =>
    `${at} has residuals at ${f.count === 1 ? 'data row' : `${f.count} data rows`} ${f.rows.join(', ')}${f.count > f.rows.length ? ', …' : ''}, which the comparison drops (a missing value, or a zero weight, in a column some candidate uses); the model was fitted on rows the other candidates are not scored on, so its likelihood is not comparable — refit it on the common rows and send its residuals there.`,
  residual_missing: (f, at) =>
    `${at} is null at data row ${f.row}, which the comparison uses; every used row needs a residual.`,
  estimation_mixed: (f, at) =>
    `${at} mixes REML (${quoteList(f.reml)}) with maximum-likelihood candidates (${quoteList(f.ml)}); REML log-likelihoods are likelihoods of error contrasts, not of the data, and cannot be compared with ML ones — refit all by ML to compare models with different fixed effects.`,
  reml_fixed_effects_missing: (f, at) =>
    `${at} (${JSON.stringify(f.name)}) is a REML likelihood without fixedEffects; REML likelihoods compare only models with the same fixed effects, so state them.`,
  reml_fixed_effects_differ: (f, at) =>
    `${at} (${JSON.stringify(f.name)}) has fixed effects ${quoteList(f.fixedEffects)} but ${JSON.stringify(f.first)} has ${quoteList(f.firstFixedEffects)}; REML likelihoods are comparable only between models with the same fixed effects — refit by ML to compare fixed effects.`,
  response_transform_domain: (f, at) =>
    `${at} asks for ${f.fn} of the response, whose value at row ${f.row} is ${f.value}; ${f.fn} and its Jacobian need a positive response.`,
  data_required: (f, at) =>
    `${at} (${f.form}) needs data: send data.columns with the response column.`,
  fingerprint_mismatch: (f, at) =>
    f.actual === null
      ? `${at} expects dataset ${f.expected}, but the request has no data to fingerprint.`
      : `${at} expects dataset ${f.expected}, but the rows this comparison uses fingerprint as ${f.actual}; the data differ from what the caller expected.`,
  nested_test_invalid: (f, at) => `${at} names a pair that cannot be tested: ${f.reason}`,
  prediction_column_missing: (f, at) =>
    `${at} lacks column ${JSON.stringify(f.column)}, which a fitted candidate uses; the prediction rows need every column the fitted candidates use${f.sent.length > 0 ? ` (they have ${quoteList(f.sent)})` : ''}.`,
  prediction_level_unknown: (f, at) =>
    `${at} holds level ${JSON.stringify(f.level)} of column ${JSON.stringify(f.column)}, which the rows the models were fitted on do not have (they have ${quoteList(f.levels)}); a model predicts only at levels it was fitted on.`,
  prediction_weight_invalid: (f, at) =>
    `${at} gives the new observation at row ${f.row} the weight ${f.value === null ? 'null' : JSON.stringify(f.value)}; a weight in the prediction rows must be a positive number (leave the weights column out for weight 1).`,
  work_limit: (f, at) =>
    `The request would take about ${roughly(f.estimate)} ${f.unit} of computing (estimated from its shape before any of it runs), above the limit of ${roughly(f.limit)} (${f.setting}); the largest part is ${f.largest}, at ${at}. ${f.remedy}.`,
  memory_limit: (f, at) =>
    `The request would need about ${mebibytes(f.estimate)} of working memory (estimated before any is allocated), above the limit of ${mebibytes(f.limit)} (${f.setting}); the largest part is ${f.largest}, at ${at}. ${f.remedy}.`,
  result_size_limit: (f, at) =>
    f.measured
      ? `The answer came to ${mebibytes(f.estimate)} of JSON, and its audit record would hold as much, above the limit of ${mebibytes(f.limit)} (${f.setting}); nothing was recorded. ${f.remedy}.`
      : `The answer would be about ${mebibytes(f.estimate)} of JSON (estimated before computing), and its audit record would hold as much, above the limit of ${mebibytes(f.limit)} (${f.setting}); the largest part is ${f.largest}, at ${at}. ${f.remedy}.`,
  design_columns_limit: (f, at) =>
    `${f.what} is over the limit of ${f.limit} design columns per model (${f.setting}); its widest term is at ${at}. A factor takes one column per level but one, and a product of factors one per combination of their levels: merge rare levels, drop products of factors, or send a data summary of numeric columns (data.summary).`,
  summary_rows_invalid: (f, at) => `${at} is ${f.rows === null ? 'not a number' : f.rows}; a summary's rows must be a whole number of at least 1.`,
  summary_columns_invalid: (f, at) => `${at} lists ${JSON.stringify(f.column)} more than once or empty; a summary's columns must be distinct, non-empty names.`,
  summary_size_mismatch: (f, at) => `${at} has ${f.length} entries for ${f.expected} columns; means has one entry per column and centredCrossProducts one row and column per column.`,
  summary_value_not_finite: (f, at) => `${at} (column ${JSON.stringify(f.column)}) is not a finite number.`,
  summary_not_symmetric: (f, at) => `${at}: centredCrossProducts[${f.row}][${f.column}] differs from [${f.column}][${f.row}]; centred cross products are symmetric.`,
  summary_negative_variance: (f, at) => `${at}: the centred sum of squares of ${JSON.stringify(f.column)} is ${f.value}; no rows give a negative sum of squares.`,
  summary_not_positive_semidefinite: (f, at) => `${at} is not positive semidefinite (it fails at column ${JSON.stringify(f.column)}); no rows have these moments.`,
  summary_weights_invalid: (_f, at) => `${at}: weights.sum must be a positive number and weights.sumLog a finite number.`,
  summary_columns_differ: (f, at) => `${at}: the summaries list different columns (${quoteList(f.first)} and ${quoteList(f.second)}); merging needs the same columns in the same order.`,
  summary_weighting_differs: (f, at) => `${at}: one summary is weighted (${f.firstWeighted}/${f.secondWeighted}) and the other is not; they cannot be merged.`,
  summary_column_unknown: (f, at) => `${at} lists no column ${JSON.stringify(f.column)}; with a data summary only its listed columns can be used.`,
  summary_rows_needed: (f, at) => `${at} (${f.form}) cannot be computed from a data summary: ${f.reason}. Send data.columns instead.`,
  search_coding_varies: (f, at) =>
    `${at} (${f.label}) is coded one way in subsets that hold ${f.declaredBy} and another way in subsets that do not, because ${f.declaredBy} declares column ${JSON.stringify(f.column)} a factor (or sets its reference level) for every term of a model; a search scores each term one way, so it cannot rank both. Put ${f.declaredBy} in always, so every subset codes ${JSON.stringify(f.column)} alike, or take it out of the pool.`,
  hierarchy_always_incomplete: (f, at) =>
    f.inPool
      ? `${at} (${f.label}) is in every model, and under the hierarchy rule it needs ${f.needs}, which is in the pool and so missing from some subsets; move ${f.needs} to always, or set hierarchy to false.`
      : `${at} (${f.label}) is in every model, and under the hierarchy rule it needs ${f.needs}, which is in neither the pool nor always, so no subset is admissible; add ${f.needs} to always, or set hierarchy to false.`,
  search_over_budget: (f, at) =>
    `${at}: the search is beyond its compute budget ${f.budget} = ${f.limit} (this pool of ${f.poolTerms} terms needs ${f.required}); narrow the pool or move terms to always.`,
};

/** Makes an issue with its standard message. */
export function issue<C extends IssueCode>(code: C, path: IssuePath, facts: IssueFacts[C]): Issue {
  const at = path.length === 0 ? 'The request' : issuePointer(path);
  const message = (MESSAGES[code] as (f: IssueFacts[C], at: string) => string)(facts, at);
  return { code, path, message, ...facts } as Issue;
}
