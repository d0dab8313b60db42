// The data columns an expression uses, on the rows the comparison uses, as
// numbers. The comparison's common rows have already dropped rows with a
// missing value in any used column; what is left to check is that each
// column is numeric (a categorical column has no value to put in a formula).
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import type { Columns } from '../../types.ts';
import type { NonlinearCandidate } from './candidate.ts';

export function expressionColumnValues(
  candidate: NonlinearCandidate,
  columns: Columns,
  rows: readonly number[],
  at: IssuePath,
): { values: Float64Array[] } | { issues: Issue[] } {
  const issues: Issue[] = [];
  const values = candidate.columns.map((name, c) => {
    const column = columns[name];
    const out = new Float64Array(rows.length);
    for (let i = 0; i < rows.length; i++) {
      const v = column[rows[i]];
      if (typeof v === 'string') {
        issues.push(issue('expression_column_not_numeric', [...at, 'expression'], { offset: candidate.columnOffsets[c], column: name, row: rows[i], value: v }));
        break;
      }
      if (typeof v !== 'number') {
        issues.push(issue('value_missing', ['data', 'columns', name], { column: name, row: rows[i] }));
        break;
      }
      if (!Number.isFinite(v)) {
        issues.push(issue('value_not_finite', ['data', 'columns', name], { column: name, row: rows[i] }));
        break;
      }
      out[i] = v;
    }
    return out;
  });
  return issues.length > 0 ? { issues } : { values };
}
