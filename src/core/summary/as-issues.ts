// Summary problems in the comparison's issue form, so the HTTP layer maps
// them to a 422 like every other problem the core reports.
import { issue, type Issue, type IssueFacts } from '../issues.ts';
import type { SummaryIssue } from './types.ts';

export function summaryIssues(issues: readonly SummaryIssue[]): Issue[] {
  return issues.map((s) => issue(s.code, s.path, s.facts as unknown as IssueFacts[typeof s.code]));
}
