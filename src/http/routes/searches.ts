// POST /v1/searches: priced from its shape, then run entirely in the compute
// pool — prepared, scored on every free worker, the best refitted exactly —
// recorded in the audit store (kind 'search'), answered as JSON or, with
// Accept: text/event-stream, as progress events ending with the result. No
// result leaves without its record; a client that goes away stops the work
// and leaves no record.
import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
// The schemas first: they register in import order, and that order is the OpenAPI document's.
import { ProblemSchema } from '../schemas/problem.ts';
import { SearchRequest } from '../schemas/search-request.ts';
import { SearchResult } from '../schemas/search-response.ts';
import { requestDigestOfParsed, type JsonValue } from '../../audit/chain.ts';
import type { Config } from '../../config.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { serviceVersion } from '../../version.ts';
import { keptRequest } from '../audit-append.ts';
import { watchClient } from '../compute/client-gone.ts';
import { priceSearchRequest } from '../compute/price-request.ts';
import { CLIENT_GONE, inSession, type ComputeService } from '../compute/run.ts';
import type { SearchAnswer } from '../jobs/search-jobs.ts';
import { computeSearch } from '../compute/search-run.ts';
import { Refusal } from '../plugins/refusal.ts';
import { issuesProblem, problem, problemTypes, PROBLEM_CONTENT_TYPE, type Problem } from '../problems.ts';
import { EventStream, wantsEventStream } from '../sse.ts';

export interface SearchRouteOptions {
  store: AuditStore;
  config: Config;
  policy: ActivePolicy;
  compute: ComputeService;
}

/** Progress events at most this often. */
const PROGRESS_INTERVAL_MS = 250;

const storeProblem = (): Problem =>
  problem(503, problemTypes.storeUnavailable, 'Audit store unavailable', 'the search was computed but could not be recorded, so no result is returned; retry later');

export const searchRoutes: FastifyPluginAsyncZod<SearchRouteOptions> = async (app, { store, config, policy, compute }) => {
  app.post('/v1/searches', {
    schema: {
      tags: ['searches'],
      summary: 'Score every subset of a pool of terms, refit the best and record the search',
      description: [
        'Every subset of `pool` (with the `always` terms; with `hierarchy`, only subsets holding the terms a power or product is built from) is a candidate, scored on the workers of the compute pool (branch and bound beyond 2^24 subsets, with `proven` saying whether the top list is proven); the best `top` are refitted exactly and returned with their weights over every subset scored, and the search is appended to the audit chain. The example is the demo scenario (tile shrinkage, invented data).',
        'With `family` (and `link`, `offset`, `trials`) every subset is a generalised linear model fitted by IRLS, each started from the coefficients of the subset it was reached from: every subset when the pool has at most 16 terms and the price affords them all, else stepwise selection with swaps (`method: "stepwiseSwaps"`, `proven: false`); subsets that separate or do not converge are skipped and counted in `glm.fitFailures`. Criteria rank the subsets; they do not validate the chosen model.',
        'With Accept: text/event-stream the answer is server-sent events: `progress` ({ covered, total, nodes, bound }: subsets accounted for, of all; for branch and bound the tree nodes visited and the criterion value a subset must beat to enter the best `top` known so far, else 0 and null) at most every 250 ms, then one `result` (this 200 body) or `problem` (a problem+json body). Requests that cannot start (priced over a limit, the compute queue full) are answered with their status as usual.',
      ].join('\n\n'),
      body: SearchRequest,
      response: { 200: SearchResult, 400: ProblemSchema, 413: ProblemSchema, 415: ProblemSchema, 422: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const body = request.body;
    const priced = priceSearchRequest(body, compute.caps, compute.pool.size);
    if ('issues' in priced) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(priced.issues));
    const watch = watchClient(reply);
    // Set once the search is admitted (inside the session), so held in an object the closures share.
    const answering: { stream: EventStream | null } = { stream: null };
    const fail = (status: 422 | 503, failure: Problem, headers: Record<string, string> = {}): FastifyReply => {
      if (answering.stream) answering.stream.end('problem', failure);
      else reply.code(status).headers(headers).type(PROBLEM_CONTENT_TYPE).send(failure);
      return reply;
    };
    try {
      let lastProgress = 0;
      const computed = await inSession(compute.pool, reply, watch, (session) => computeSearch(session, { body, policy, budget: priced.budget, compute }, {
        // Admitted and prepared: only now does the answer become a stream, so a full queue is still a plain 503
        // and a request that cannot start a plain 422.
        onPrepared: () => {
          const stream = wantsEventStream(request.headers.accept) ? new EventStream(reply, () => session.cancel()) : null;
          answering.stream = stream;
          stream?.send('progress', { covered: 0, total: 2 ** body.pool.length, nodes: 0, bound: null });
        },
        onProgress: (p) => {
          const now = performance.now();
          if (answering.stream && now - lastProgress >= PROGRESS_INTERVAL_MS) {
            lastProgress = now;
            answering.stream.send('progress', { covered: p.covered, total: p.total, nodes: p.nodes, bound: p.bound });
          }
        },
      }));
      if (computed === CLIENT_GONE || watch.gone) {
        request.log.info('search abandoned: the client went away before its answer; nothing recorded');
        return reply;
      }
      if ('issues' in computed) return fail(422, issuesProblem(computed.issues));
      if ('problem' in computed) return fail(422, computed.problem);
      return await recordAndAnswer(computed.answer, { store, config, body, reply, stream: answering.stream, fail });
    } catch (error) {
      const stream = answering.stream;
      if (!stream) throw error;
      // The reply is already a stream: end it with a problem event rather than leave it open.
      if (!(error instanceof Refusal)) request.log.error({ err: error }, 'search failed');
      stream.end('problem', error instanceof Refusal
        ? error.body
        : problem(500, problemTypes.internal, 'Internal error', `the search failed on the service's own account; quote request id ${request.id} when reporting it`));
      return reply;
    } finally {
      watch.stop();
    }
  });

  async function recordAndAnswer(answer: SearchAnswer, ctx: {
    store: AuditStore; config: Config; body: SearchRequest; reply: FastifyReply; stream: EventStream | null;
    fail: (status: 422 | 503, failure: Problem, headers?: Record<string, string>) => FastifyReply;
  }): Promise<FastifyReply> {
    const { reply, stream } = ctx;
    const request = reply.request;
    let record;
    try {
      record = await ctx.store.append({
        kind: 'search',
        caller: request.caller,
        label: ctx.body.label ?? null,
        serviceVersion,
        conventionsVersion: answer.conventions.version,
        policy: answer.policy,
        datasetFingerprint: answer.dataset.fingerprint,
        requestDigest: requestDigestOfParsed(request.sentBody as JsonValue),
        request: keptRequest(ctx.config, request.sentBody),
        result: answer as unknown as Record<string, unknown>,
      });
    } catch (error) {
      app.metrics?.auditAppendFailures.inc();
      request.log.error({ err: error }, 'audit store refused a search record');
      return ctx.fail(503, storeProblem(), { 'retry-after': '5' });
    }
    app.metrics?.searches.inc();
    app.metrics?.modelsFitted.inc(answer.models.length);
    const result = { id: record.id, createdAt: record.createdAt, serviceVersion, ...answer };
    if (stream) {
      stream.end('result', result);
      return reply;
    }
    return reply.code(200).send(result);
  }
};
