// A generalised-linear search as one job on the compute pool: prepared,
// every subset fitted by IRLS and the best refitted, all on one worker (the
// fits are independent of the main thread, and one request's fits share the
// rows they read), then answered in the shape of every search answer with the
// family's own block (glm) and the subsets whose fits failed.
import type { Issue } from '../../core/issues.ts';
import type { Cap } from '../../core/pricing/index.ts';
import type { SearchBudget } from '../../core/search/index.ts';
import { planGlmSearch, searchGlmSubsets } from '../../core/search/glm/glm-search.ts';
import { glmSearchReport } from '../../core/search/glm/glm-report.ts';
import { prepareGlmSearch } from '../../core/search/glm/prepare-glm.ts';
import { searchRankBy } from '../../core/search/report.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { serviceVersion } from '../../version.ts';
import type { Problem } from '../problems.ts';
import { representableResult } from '../representable.ts';
import { toSearchInput } from '../search-input.ts';
import type { SearchRequest } from '../schemas/search-request.ts';
import { SearchResult } from '../schemas/search-response.ts';
import { resultSizeIssue } from './result-size.ts';
import { budgetIssue, type SearchAnswer } from './search-jobs.ts';

export interface GlmSearchJob {
  kind: 'glmSearch';
  body: SearchRequest;
  policy: ActivePolicy;
  /** The budget the price left: how many IRLS fits the search may make. */
  budget: SearchBudget;
  resultCap: Cap;
  /** Hold the result to its response schema before it is recorded (RESPONSE_SCHEMA_CHECK). */
  schemaCheck: boolean;
}

export function glmSearchJob(job: GlmSearchJob): { result: SearchAnswer } | { issues: Issue[] } | { problem: Problem } {
  const { body, budget } = job;
  const input = toSearchInput(body);
  if (!input.glm) throw new Error('glmSearch job for a least-squares search');
  const ready = prepareGlmSearch({ ...input, glm: input.glm });
  if ('issues' in ready) return ready;
  const plan = planGlmSearch(body.pool.length, body.exhaustive, budget);
  if (!plan.ok) return { issues: [budgetIssue(plan.issue)] };
  const n = ready.data.rows.length;
  const choice = searchRankBy(body.rankBy, job.policy.policy, n / (ready.data.design.labels.length + 1));
  const started = performance.now();
  const outcome = searchGlmSubsets(ready.data, ready.prepared.rules, { criterion: choice.rankBy, top: body.top }, plan);
  const elapsedMs = performance.now() - started;
  const report = glmSearchReport(ready, outcome, choice, job.policy);
  const failed = outcome.failures.separation + outcome.failures.notConverged + outcome.failures.other;
  const answer = {
    ...report,
    method: outcome.method,
    evaluated: outcome.evaluated,
    subsets: outcome.subsets,
    weightsCoverAllSubsets: outcome.method === 'exhaustive',
    proven: outcome.proven,
    passedOver: {
      notHierarchical: outcome.notHierarchical,
      unscorable: outcome.unscorable,
      pruned: 0,
      rankDeficient: outcome.rankDeficient,
      sameColumnSpace: 0,
      exactFit: 0,
      fitFailed: failed,
    },
    rankDeficient: outcome.rankDeficient,
    budget: { ...budget, estimatedFlops: null, nodes: outcome.visited, elapsedMs },
    threads: 1,
  };
  const checked = representableResult(SearchResult, answer, { id: '', createdAt: '', serviceVersion }, job.schemaCheck);
  if ('problem' in checked) return checked;
  const tooLarge = resultSizeIssue(JSON.stringify(checked.result), job.resultCap, 'Ask for fewer top models, or narrow the pool');
  return tooLarge ? { issues: [tooLarge] } : { result: checked.result as unknown as SearchAnswer };
}
