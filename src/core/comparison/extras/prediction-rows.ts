// New rows to predict, validated like data: every column a fitted candidate
// uses, of the same kind as in the data, no missing values, factor levels the
// data know. Each candidate's prediction design is built together with the
// data's rows so factor coding (levels, reference) is exactly the data's.
import { buildDesign } from '../../design/index.ts';
import { factorLevels } from '../../design/index.ts';
import { issue, type Issue } from '../../issues.ts';
import type { Columns, DesignMatrix, Term } from '../../types.ts';

export type PredictionColumns = Readonly<Record<string, ReadonlyArray<number | string | null>>>;

const at = (column: string, row?: number) => ['options', 'predict', 'columns', column, ...(row === undefined ? [] : [row])];

/**
 * The prediction rows checked, their count, and the weight each new
 * observation is taken to have: 1, or its value in the weights column when
 * the prediction rows carry that column.
 */
export function checkPredictionRows(
  data: Columns,
  rows: readonly number[],
  used: readonly string[],
  predict: PredictionColumns,
  weightsColumn: string | null = null,
): { count: number; newWeights: number[] } | { issues: Issue[] } {
  const issues: Issue[] = [];
  let count: number | null = null;
  const sent = Object.keys(predict);
  const lengthOf = (name: string, values: ReadonlyArray<unknown>) => {
    if (count === null) count = values.length;
    else if (values.length !== count) issues.push(issue('column_length_mismatch', at(name), { column: name, length: values.length, expected: count }));
  };
  for (const name of used) {
    if (!Object.prototype.hasOwnProperty.call(predict, name)) {
      issues.push(issue('prediction_column_missing', ['options', 'predict', 'columns'], { column: name, sent: sent.slice(0, 20) }));
      continue;
    }
    const values = predict[name];
    lengthOf(name, values);
    const numeric = typeof data[name].find((v) => v !== null) === 'number';
    const levels = numeric ? null : new Set(factorLevels(data[name], rows));
    values.forEach((v, r) => {
      if (v === null) issues.push(issue('value_missing', at(name, r), { column: name, row: r, predictionRow: true }));
      else if (numeric && typeof v !== 'number') issues.push(issue('column_mixed_types', at(name, r), { column: name, row: r }));
      else if (!numeric && (typeof v !== 'string' || !levels!.has(v))) {
        issues.push(issue('prediction_level_unknown', at(name, r), { column: name, level: String(v), levels: [...levels!] }));
      }
    });
  }
  let weights: ReadonlyArray<number | string | null> | null = null;
  if (weightsColumn !== null && Object.prototype.hasOwnProperty.call(predict, weightsColumn) && !used.includes(weightsColumn)) {
    weights = predict[weightsColumn];
    lengthOf(weightsColumn, weights);
    weights.forEach((v, r) => {
      if (typeof v !== 'number' || !(v > 0)) issues.push(issue('prediction_weight_invalid', at(weightsColumn, r), { column: weightsColumn, row: r, value: v }));
    });
  }
  if (issues.length > 0) return { issues: issues.slice(0, 50) };
  const n = count ?? 0;
  return { count: n, newWeights: Array.from({ length: n }, (_, r) => (weights ? (weights[r] as number) : 1)) };
}

/** The design of the prediction rows for one candidate, coded as the data are. */
export function predictionDesign(
  data: Columns,
  rows: readonly number[],
  predict: PredictionColumns,
  count: number,
  terms: readonly Term[],
  intercept: boolean,
  candidateIndex: number,
): { design: DesignMatrix } | { issues: Issue[] } {
  const total = Math.max(0, ...Object.values(data).map((v) => v.length));
  const combined: Record<string, ReadonlyArray<number | string | null>> = Object.create(null);
  for (const name of Object.keys(predict)) {
    if (Object.prototype.hasOwnProperty.call(data, name)) combined[name] = [...data[name], ...new Array(total - data[name].length).fill(null), ...predict[name]];
  }
  const newRows = Array.from({ length: count }, (_, j) => total + j);
  const built = buildDesign(combined, terms, intercept, [...rows, ...newRows], ['candidates', candidateIndex]);
  if ('issues' in built) {
    // A domain problem on a new row is the prediction's, not the candidate's: its
    // path, row and message are told again in the prediction rows' own numbering.
    return {
      issues: built.issues.map((i) => {
        if (!('row' in i && typeof i.row === 'number' && i.row >= total && 'column' in i)) return i;
        const { code, path: _path, message: _message, ...facts } = i;
        return issue(code, at(String(i.column), i.row - total), { ...facts, row: i.row - total } as never);
      }),
    };
  }
  const d = built.design;
  const n = rows.length;
  return {
    design: {
      rows: count,
      labels: d.labels,
      keys: d.keys,
      high: d.high.map((c) => c.slice(n)),
      low: d.low.map((c) => c.slice(n)),
      intercept: d.intercept,
      termOfColumn: d.termOfColumn,
    },
  };
}
