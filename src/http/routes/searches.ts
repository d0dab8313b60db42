// POST /v1/searches: every subset of a pool of terms scored on every core,
// the best refitted exactly, recorded in the audit store (kind 'search'),
// answered as JSON or, with Accept: text/event-stream, as progress events
// ending with the result. No result leaves without its record.
import { availableParallelism } from 'node:os';
import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
import { requestDigest } from '../../audit/chain.ts';
import type { Config } from '../../config.ts';
import { keptRequest } from '../audit-append.ts';
import { representableResult } from '../representable.ts';
import type { Issue } from '../../core/issues.ts';
import { DEFAULT_SEARCH_BUDGET, planSearch, type BudgetIssue, type SearchBudget } from '../../core/search/index.ts';
import { prepareSearch, type SearchRequestInput } from '../../core/search/request-problem.ts';
import { searchRankBy, searchReport } from '../../core/search/report.ts';
import { runSearch } from '../../search/workers/index.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { serviceVersion } from '../../version.ts';
import { ownColumns } from '../comparison-input.ts';
import { issuesProblem, problem, problemTypes, PROBLEM_CONTENT_TYPE, type Problem } from '../problems.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { SearchRequest } from '../schemas/search-request.ts';
import { SearchResult } from '../schemas/search-response.ts';
import { EventStream, wantsEventStream } from '../sse.ts';

export interface SearchRouteOptions {
  store: AuditStore;
  config: Config;
  policy: ActivePolicy;
  /** Worker threads per search; default every core (os.availableParallelism()). */
  threads?: number;
  budget?: SearchBudget;
}

/** Progress events at most this often. */
const PROGRESS_INTERVAL_MS = 250;

function toSearchInput(body: SearchRequest): SearchRequestInput {
  return {
    columns: 'columns' in body.data ? ownColumns(body.data.columns) : null,
    summary: 'summary' in body.data ? body.data.summary : null,
    response: body.response,
    weights: body.weights ?? null,
    pool: body.pool,
    always: body.always,
    hierarchy: body.hierarchy,
    intercept: body.intercept,
    top: body.top,
  };
}

/** The budget's own sentence (it names the budget and the figures), with its facts flattened as every issue's are. */
const budgetIssue = (b: BudgetIssue): Issue => ({ code: b.code, path: b.path, message: b.message, ...b.facts });

const storeProblem = (): Problem =>
  problem(503, problemTypes.storeUnavailable, 'Audit store unavailable', 'the search was computed but could not be recorded, so no result is returned; retry later');

export const searchRoutes: FastifyPluginAsyncZod<SearchRouteOptions> = async (app, options) => {
  const { store, config, policy } = options;
  const budget = options.budget ?? DEFAULT_SEARCH_BUDGET;
  const threads = options.threads ?? availableParallelism();

  app.post('/v1/searches', {
    schema: {
      tags: ['searches'],
      summary: 'Score every subset of a pool of terms, refit the best and record the search',
      description: [
        'Every subset of `pool` (with the `always` terms; with `hierarchy`, only subsets holding the terms a power or product is built from) is a candidate, scored on every core; the best `top` are refitted exactly and returned with their weights over every subset scored, and the search is appended to the audit chain. The example is the demo scenario (tile shrinkage, invented data).',
        'With Accept: text/event-stream the answer is server-sent events: `progress` ({ covered, total }) at most every 250 ms, then one `result` (this 200 body) or `problem` (a problem+json body). Requests that cannot start are answered with their status as usual.',
      ].join('\n\n'),
      body: SearchRequest,
      response: { 200: SearchResult, 400: ProblemSchema, 413: ProblemSchema, 415: ProblemSchema, 422: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const body = request.body;
    const refuse = (issues: Issue[]) => reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(issues));
    const prepared = prepareSearch(toSearchInput(body), { maxWorkCells: config.maxWorkCells });
    if ('issues' in prepared) return refuse(prepared.issues);
    const { problem: subsets } = prepared;
    const plan = planSearch(subsets, { exhaustive: body.exhaustive }, budget);
    if (!plan.ok) return refuse([budgetIssue(plan.issue)]);
    const largestK = subsets.dimension - 1 + (subsets.intercept ? 1 : 0) + 1;
    const choice = searchRankBy(body.rankBy, policy.policy, subsets.observations / largestK);

    const abort = new AbortController();
    const stream = wantsEventStream(request.headers.accept) ? new EventStream(reply, () => abort.abort()) : null;
    let lastProgress = 0;
    stream?.send('progress', { covered: 0, total: plan.subsets });
    const started = performance.now();
    let run;
    try {
      // 'skip': a subset with aliased columns, or one spanning another's column space, is the same model again; counted once.
      run = await runSearch(subsets, { criterion: choice.rankBy, top: body.top, rankDeficient: 'skip' }, {
        threads, budget, exhaustive: body.exhaustive, signal: abort.signal,
        onProgress: (p) => {
          const now = performance.now();
          if (stream && now - lastProgress >= PROGRESS_INTERVAL_MS) {
            lastProgress = now;
            stream.send('progress', { covered: p.covered, total: p.total });
          }
        },
      });
    } catch (error) {
      if (abort.signal.aborted) {
        request.log.info('search abandoned: the client went away');
        return reply;
      }
      if (!stream) throw error;
      // The reply is already a stream: end it with a problem event rather than leave it open.
      request.log.error({ err: error }, 'search failed');
      stream.end('problem', problem(500, problemTypes.internal, 'Internal error', `the search failed on the service's own account; quote request id ${request.id} when reporting it`));
      return reply;
    }
    const elapsedMs = performance.now() - started;
    const fail = (status: 422 | 503, body: Problem): FastifyReply => {
      if (stream) {
        stream.end('problem', body);
        return reply;
      }
      return reply.code(status).type(PROBLEM_CONTENT_TYPE).send(body);
    };
    if (!run.ok) return fail(422, issuesProblem([budgetIssue(run.issue)]));
    const { outcome } = run;
    const { exactFits, ...report } = searchReport(prepared, outcome, choice, policy);
    const answer = {
      ...report,
      method: outcome.method,
      evaluated: outcome.evaluated,
      subsets: outcome.subsets,
      weightsCoverAllSubsets: outcome.weightsCoverAllSubsets,
      passedOver: {
        notHierarchical: outcome.notHierarchical,
        unscorable: outcome.unscorable,
        pruned: outcome.pruned,
        rankDeficient: outcome.rankDeficient,
        sameColumnSpace: outcome.sameColumnSpace,
        exactFit: exactFits,
      },
      rankDeficient: outcome.rankDeficient,
      budget: { ...run.budget, estimatedFlops: run.estimatedFlops, nodes: outcome.nodes, elapsedMs },
      threads: run.threads,
    };
    const checked = representableResult(SearchResult, answer, { id: '', createdAt: '', serviceVersion });
    if ('problem' in checked) return fail(422, checked.problem);
    let record;
    try {
      record = await store.append({
        kind: 'search',
        caller: request.caller,
        label: body.label ?? null,
        serviceVersion,
        conventionsVersion: report.conventions.version,
        policy: report.policy,
        datasetFingerprint: report.dataset.fingerprint,
        requestDigest: requestDigest(request.sentBody),
        request: keptRequest(config, request.sentBody),
        result: checked.result as unknown as Record<string, unknown>,
      });
    } catch (error) {
      app.metrics?.auditAppendFailures.inc();
      request.log.error({ err: error }, 'audit store refused a search record');
      if (!stream) reply.header('retry-after', '5');
      return fail(503, storeProblem());
    }
    app.metrics?.searches.inc();
    app.metrics?.modelsFitted.inc(report.models.length);
    const result = { id: record.id, createdAt: record.createdAt, serviceVersion, ...checked.result };
    if (stream) {
      stream.end('result', result);
      return reply;
    }
    return reply.code(200).send(result);
  });
};
