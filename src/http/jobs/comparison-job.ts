// One comparison as a job: the same pure computation on a worker or, for a
// small request, on the main thread. It returns the checked result (every
// number representable, the answer within MAX_RESULT_BYTES), the issues that
// prevent it, or the problem of a result that cannot be represented. The
// result's JSON text, written once here to measure it, travels with it: the
// audit record stores it and the answer is made from it.
import type { Cap } from '../../core/pricing/index.ts';
import type { Issue } from '../../core/issues.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { serviceVersion } from '../../version.ts';
import { computeComparison } from '../comparison-input.ts';
import type { Problem } from '../problems.ts';
import { representableResult } from '../representable.ts';
import type { ComparisonRequest } from '../schemas/comparison-request.ts';
import { ComparisonResult } from '../schemas/comparison-response.ts';
import { resultSizeIssue } from './result-size.ts';

export interface ComparisonJob {
  kind: 'comparison';
  body: ComparisonRequest;
  policy: ActivePolicy;
  resultCap: Cap;
}

type Computed = Extract<ReturnType<typeof computeComparison>, { result: unknown }>['result'];

export type ComparisonJobOutcome = { result: Computed; resultJson: string } | { issues: Issue[] } | { problem: Problem };

export function comparisonJob(job: ComparisonJob): ComparisonJobOutcome {
  const outcome = computeComparison(job.body, job.policy);
  if ('issues' in outcome) return { issues: outcome.issues };
  const checked = representableResult(ComparisonResult, outcome.result, { id: '', createdAt: '', serviceVersion });
  if ('problem' in checked) return checked;
  const resultJson = JSON.stringify(checked.result);
  const tooLarge = resultSizeIssue(resultJson, job.resultCap, 'Predict at fewer new rows, or send fewer candidates or terms');
  return tooLarge ? { issues: [tooLarge] } : { result: checked.result, resultJson };
}
