// One search on the compute pool, for POST /v1/searches and for its replay:
// prepared on a worker, scored on every free worker, the best refitted
// exactly on a worker. Nothing here answers or records: the caller does.
import type { ComputeSession } from '../../compute/index.ts';
import type { Issue } from '../../core/issues.ts';
import { DEFAULT_SEARCH_BUDGET, type SearchBudget } from '../../core/search/index.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { runSearch, type SearchProgress } from '../../search/workers/index.ts';
import type { JobResults } from '../jobs/index.ts';
import { budgetIssue, type SearchAnswer } from '../jobs/search-jobs.ts';
import { forWorker } from '../jobs/transport.ts';
import type { Problem } from '../problems.ts';
import type { SearchRequest } from '../schemas/search-request.ts';
import { isLeastSquaresSearch } from '../search-input.ts';
import type { ComputeService } from './run.ts';

/** What a search needs of a compute session: run a job, or run one and say on which worker. */
export type SearchSession = Pick<ComputeSession, 'run' | 'runOn'>;

/** What a search needs of the compute service: how many workers share its subsets, and the result's caps and check. */
export type SearchService = Pick<ComputeService, 'schemaCheck'> & { caps: Pick<ComputeService['caps'], 'resultBytes'>; pool: { size: number } };

export type SearchComputed = { answer: SearchAnswer } | { issues: Issue[] } | { problem: Problem };

type Prepared = Extract<JobResults['searchPrepare'], { prepared: unknown }>['prepared'];

export interface SearchRunHooks {
  /** Called once the search is prepared and about to be scored (the POST turns its answer into a stream here). */
  onPrepared?: () => void;
  onProgress?: (p: SearchProgress) => void;
}

/** Score and report a prepared search, every piece on the pool's workers. */
async function scoreAndReport(session: SearchSession, prepared: Prepared, body: SearchRequest, policy: ActivePolicy, budget: SearchBudget, compute: SearchService, onProgress: (p: SearchProgress) => void): Promise<SearchComputed> {
  const { problem: subsets, choice } = prepared;
  const started = performance.now();
  // 'skip': a subset with aliased columns, or one spanning another's column space, is the same model again; counted once.
  const run = await runSearch(subsets, { criterion: choice.rankBy, top: body.top, rankDeficient: 'skip' }, {
    run: (task) => session.runOn({ kind: 'searchTask', task }),
    parallelism: compute.pool.size,
    budget,
    exhaustive: body.exhaustive,
    onProgress,
  });
  if (!run.ok) {
    // A node budget narrowed by the price comes from the work cap: name its setting too.
    const narrowed = run.issue.facts.budget === 'maxNodes' && budget.maxNodes < DEFAULT_SEARCH_BUDGET.maxNodes;
    return { issues: [narrowed ? { ...budgetIssue(run.issue), setting: 'MAX_REQUEST_WORK' } as Issue : budgetIssue(run.issue)] };
  }
  const elapsedMs = performance.now() - started;
  const report = await session.run<JobResults['searchReport']>(forWorker({
    kind: 'searchReport', body, policy, prepared, outcome: run.outcome,
    run: { threads: run.threads, elapsedMs, budget: run.budget, estimatedFlops: run.estimatedFlops },
    resultCap: compute.caps.resultBytes,
    schemaCheck: compute.schemaCheck,
  }));
  return 'result' in report ? { answer: report.result } : report;
}

/** The whole search in an open session, under the budget its price left. */
export async function computeSearch(
  session: SearchSession,
  work: { body: SearchRequest; policy: ActivePolicy; budget: SearchBudget; compute: SearchService },
  hooks: SearchRunHooks = {},
): Promise<SearchComputed> {
  const { body, policy, budget, compute } = work;
  if (!isLeastSquaresSearch(body)) {
    // Every subset an IRLS fit: the whole search is one job on one worker, answered (or refused) before any stream opens.
    const done = await session.run<JobResults['glmSearch']>(forWorker({ kind: 'glmSearch', body, policy, budget, resultCap: compute.caps.resultBytes, schemaCheck: compute.schemaCheck }));
    if ('result' in done) {
      hooks.onPrepared?.();
      return { answer: done.result };
    }
    return done;
  }
  const prepared = await session.run<JobResults['searchPrepare']>(forWorker({ kind: 'searchPrepare', body, policy, budget }));
  if ('issues' in prepared) return prepared;
  hooks.onPrepared?.();
  return scoreAndReport(session, prepared.prepared, body, policy, budget, compute, hooks.onProgress ?? (() => {}));
}
