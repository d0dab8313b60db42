// Which terms a data summary can serve. A summary holds the moments of its
// listed columns only, so a term is usable when it is one of them by name;
// a power, product, transform or factor needs its column formed from the
// rows (unless the caller summarised that column too, under its own name).
import { INTERCEPT_LABEL, termLabel } from '../design/labels.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';
import type { Term } from '../types.ts';
import type { DataSummary } from './types.ts';

export function summaryPredictors(summary: DataSummary, terms: readonly Term[], at: IssuePath, intercept = false): { predictors: string[] } | { issues: Issue[] } {
  const listed = new Set(summary.columns);
  const issues: Issue[] = [];
  const predictors: string[] = [];
  const first = new Map<string, number>();
  terms.forEach((term, j) => {
    if (typeof term !== 'string') {
      issues.push(issue('summary_rows_needed', [...at, j], {
        form: `term ${termLabel(term)}`,
        reason: `a ${term.kind} term is formed from the rows; summarise its column under a name of its own and use that name`,
      }));
    } else if (!listed.has(term)) {
      issues.push(issue('summary_column_unknown', [...at, j], { column: term }));
    } else if (intercept && term === INTERCEPT_LABEL) {
      issues.push(issue('duplicate_term', [...at, j], { label: term, first: -1 }));
    } else if (first.has(term)) {
      // As on the rows (buildDesign): a term repeated is a request error, not an aliased column.
      issues.push(issue('duplicate_term', [...at, j], { label: term, first: first.get(term) as number }));
    } else {
      first.set(term, j);
      predictors.push(term);
    }
  });
  return issues.length > 0 ? { issues } : { predictors };
}

/** The response must be a listed column with some spread to explain. */
export function summaryResponseIssues(summary: DataSummary, response: string, at: IssuePath = ['response']): Issue[] {
  const j = summary.columns.indexOf(response);
  if (j < 0) return [issue('summary_column_unknown', at, { column: response })];
  if (summary.rows >= 2 && summary.centredCrossProducts[j][j] === 0) {
    return [issue('response_constant', at, { column: response, value: summary.means[j], rows: summary.rows })];
  }
  return [];
}
