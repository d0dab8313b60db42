// A search as jobs on the compute pool, so none of it runs on the main
// thread: prepare (the design, its cross products, the plan and the ranking
// criterion), then the kernel's tasks (src/search/workers: pure functions of
// their messages, spread over the workers), then the report (the best
// subsets refitted exactly, the answer checked and measured). What the
// report needs from the preparation travels with it, the rows as an
// Int32Array so the hand-over is a copy of memory, not of a list.
import type { Issue } from '../../core/issues.ts';
import type { Cap } from '../../core/pricing/index.ts';
import { planSearch, type BudgetIssue, type SearchBudget, type SearchOutcome, type SearchPlan } from '../../core/search/index.ts';
import { prepareSearch, type PreparedSearch, type SearchSource } from '../../core/search/request-problem.ts';
import { searchRankBy, searchReport } from '../../core/search/report.ts';
import type { RankByChoice } from '../../core/scoring/policy.ts';
import type { SearchCriterion } from '../../core/search/types.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { serviceVersion } from '../../version.ts';
import { ownColumns } from '../comparison-input.ts';
import type { Problem } from '../problems.ts';
import { representableResult } from '../representable.ts';
import { toSearchInput } from '../search-input.ts';
import type { SearchRequest } from '../schemas/search-request.ts';
import { SearchResult } from '../schemas/search-response.ts';
import { resultSizeIssue } from './result-size.ts';

type RowsInTransit = Omit<Extract<SearchSource, { kind: 'rows' }>, 'columns' | 'rows'> & { rows: Int32Array };
type SourceInTransit = RowsInTransit | Extract<SearchSource, { kind: 'summary' }>;

/** A prepared search without the request it came from (the report job has the body). */
export interface PreparedInTransit extends Omit<PreparedSearch, 'input' | 'source'> {
  source: SourceInTransit;
  choice: RankByChoice & { rankBy: SearchCriterion };
  plan: Extract<SearchPlan, { ok: true }>;
}

export interface SearchPrepareJob {
  kind: 'searchPrepare';
  body: SearchRequest;
  policy: ActivePolicy;
  /** The budget the price left for the kernel. */
  budget: SearchBudget;
}

export interface SearchReportJob {
  kind: 'searchReport';
  body: SearchRequest;
  policy: ActivePolicy;
  prepared: PreparedInTransit;
  outcome: SearchOutcome;
  run: { threads: number; elapsedMs: number; budget: SearchBudget; estimatedFlops: number | null };
  resultCap: Cap;
  /** Hold the result to its response schema before it is recorded (RESPONSE_SCHEMA_CHECK). */
  schemaCheck: boolean;
}

/** The budget's own sentence (it names the budget and the figures), with its facts flattened as every issue's are. */
export const budgetIssue = (b: BudgetIssue): Issue => ({ code: b.code, path: b.path, message: b.message, ...b.facts });

export function searchPrepareJob(job: SearchPrepareJob): { prepared: PreparedInTransit } | { issues: Issue[] } {
  const prepared = prepareSearch(toSearchInput(job.body));
  if ('issues' in prepared) return prepared;
  const { problem, source, input: _input, ...rest } = prepared;
  const plan = planSearch(problem, { exhaustive: job.body.exhaustive }, job.budget);
  if (!plan.ok) return { issues: [budgetIssue(plan.issue)] };
  const largestK = problem.dimension - 1 + (problem.intercept ? 1 : 0) + 1;
  const choice = searchRankBy(job.body.rankBy, job.policy.policy, problem.observations / largestK);
  const inTransit: SourceInTransit = source.kind === 'rows'
    ? { kind: 'rows', rows: Int32Array.from(source.rows), y: source.y, jacobian: source.jacobian, weights: source.weights, dropped: source.dropped, zeroWeights: source.zeroWeights }
    : source;
  return { prepared: { ...rest, problem, source: inTransit, choice, plan } };
}

function preparedAgain(body: SearchRequest, prepared: PreparedInTransit): PreparedSearch {
  const input = toSearchInput(body);
  const { source, choice: _choice, plan: _plan, ...rest } = prepared;
  if (source.kind === 'summary') return { ...rest, input, source };
  const columns = 'columns' in body.data ? ownColumns(body.data.columns) : {};
  return { ...rest, input, source: { ...source, columns, rows: Array.from(source.rows) } };
}

export type SearchAnswer = Record<string, unknown> & { conventions: { version: string }; policy: { name: string; hash: string }; dataset: { fingerprint: string }; models: unknown[] };

export function searchReportJob(job: SearchReportJob): { result: SearchAnswer } | { issues: Issue[] } | { problem: Problem } {
  const { outcome, run } = job;
  const { exactFits, ...report } = searchReport(preparedAgain(job.body, job.prepared), outcome, job.prepared.choice, job.policy);
  const answer = {
    ...report,
    method: outcome.method,
    evaluated: outcome.evaluated,
    subsets: outcome.subsets,
    weightsCoverAllSubsets: outcome.weightsCoverAllSubsets,
    proven: outcome.proven,
    passedOver: {
      notHierarchical: outcome.notHierarchical,
      unscorable: outcome.unscorable,
      pruned: outcome.pruned,
      rankDeficient: outcome.rankDeficient,
      sameColumnSpace: outcome.sameColumnSpace,
      exactFit: exactFits,
    },
    rankDeficient: outcome.rankDeficient,
    budget: { ...run.budget, estimatedFlops: run.estimatedFlops, nodes: outcome.nodes, elapsedMs: run.elapsedMs },
    threads: run.threads,
  };
  const checked = representableResult(SearchResult, answer, { id: '', createdAt: '', serviceVersion }, job.schemaCheck);
  if ('problem' in checked) return checked;
  const tooLarge = resultSizeIssue(JSON.stringify(checked.result), job.resultCap, 'Ask for fewer top models, or narrow the pool');
  return tooLarge ? { issues: [tooLarge] } : { result: checked.result as unknown as SearchAnswer };
}
