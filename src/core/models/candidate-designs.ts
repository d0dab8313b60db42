// The designs of candidates fitted here, built on the comparison's rows
// before any fit, so one answer names every bad term of every candidate.
import { buildDesign } from '../design/index.ts';
import { issue, type Issue } from '../issues.ts';
import type { Columns, DesignMatrix, Term } from '../types.ts';

export function candidateDesigns(
  candidates: ReadonlyMap<number, { terms: Term[]; intercept: boolean }>,
  columns: Columns,
  rows: readonly number[],
  issues: Issue[],
): Map<number, DesignMatrix> {
  const designs = new Map<number, DesignMatrix>();
  candidates.forEach((c, i) => {
    const built = buildDesign(columns, c.terms, c.intercept, rows, ['candidates', i]);
    if ('issues' in built) {
      issues.push(...built.issues);
      return;
    }
    const p = built.design.labels.length;
    // More coefficients than rows: nothing can be estimated, let alone scored.
    if (p > rows.length) issues.push(issue('too_few_rows', ['candidates', i], { rows: rows.length, parameters: p }));
    designs.set(i, built.design);
  });
  return designs;
}
