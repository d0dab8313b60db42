// One comparison as a job: the same pure computation on a worker or, for a
// small request, on the main thread. It returns the checked result (every
// number representable, the answer within MAX_RESULT_BYTES), the issues that
// prevent it, or the problem of a result that cannot be represented. The
// result's JSON text, written once here to measure it, travels with it: the
// audit record stores it and the answer is made from it.
import { canonicalJson, NotCanonicalisable } from '../../audit/chain.ts';
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
  /** Hold the result to its response schema before it is recorded (RESPONSE_SCHEMA_CHECK). */
  schemaCheck: boolean;
}

type Computed = Extract<ReturnType<typeof computeComparison>, { result: unknown }>['result'];

export type ComparisonJobOutcome = { result: Computed; resultJson: string; resultCanonical?: string } | { issues: Issue[] } | { problem: Problem };

// The result's canonical text (the record's hash covers it), written here so a
// comparison on a worker writes it there too; a result with members JSON drops
// (undefined) is left for the store, which writes what a JSON reader gets back.
function canonicalOrNothing(result: unknown): string | undefined {
  try {
    return canonicalJson(result);
  } catch (err) {
    if (err instanceof NotCanonicalisable) return undefined;
    throw err;
  }
}

export function comparisonJob(job: ComparisonJob): ComparisonJobOutcome {
  const outcome = computeComparison(job.body, job.policy);
  if ('issues' in outcome) return { issues: outcome.issues };
  const checked = representableResult(ComparisonResult, outcome.result, { id: '', createdAt: '', serviceVersion }, job.schemaCheck);
  if ('problem' in checked) return checked;
  const resultJson = JSON.stringify(checked.result);
  const tooLarge = resultSizeIssue(resultJson, job.resultCap, 'Predict at fewer new rows, or send fewer candidates or terms');
  if (tooLarge) return { issues: [tooLarge] };
  const resultCanonical = canonicalOrNothing(checked.result);
  return resultCanonical === undefined ? { result: checked.result, resultJson } : { result: checked.result, resultJson, resultCanonical };
}
