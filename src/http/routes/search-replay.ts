// POST /v1/searches/{id}/replay: the stored search request run again with
// today's code, priced and run on the compute pool as a new search is, and
// every value of the result that came out differently. Like a comparison's
// replay (replay.ts, which says why) it appends no audit record and hands out
// no new id.
//
// What a run measures rather than computes — the wall time of the scoring,
// the worker threads it had, and the branch-and-bound nodes visited (workers
// share the best bound found so far, so the count depends on their timing) —
// is left out of the comparison: it differs between any two runs.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
import type { JsonValue } from '../../core/result-diff.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { watchClient } from '../compute/client-gone.ts';
import { priceSearchRequest } from '../compute/price-request.ts';
import { CLIENT_GONE, inSession, type ComputeService } from '../compute/run.ts';
import { computeSearch } from '../compute/search-run.ts';
import { issuesProblem, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { RecordParams, ReplayReport } from '../schemas/record.ts';
import { SearchRequest } from '../schemas/search-request.ts';
import { getRecord } from './records.ts';
import { notComputable, replayReport, storedRequest } from './replay.ts';

/** A result without what the run measured (see the top of this file); anything not an object is left as it is. */
export function withoutRunMeasures(result: unknown): Record<string, unknown> {
  if (result === null || typeof result !== 'object' || Array.isArray(result)) return result as Record<string, unknown>;
  const { threads: _threads, budget, ...rest } = result as Record<string, unknown>;
  if (budget === null || typeof budget !== 'object' || Array.isArray(budget)) return { ...rest, ...(budget === undefined ? {} : { budget }) };
  const { elapsedMs: _elapsed, nodes: _nodes, ...limits } = budget as Record<string, unknown>;
  return { ...rest, budget: limits };
}

function firstModel(result: JsonValue): string | null {
  const models = (result as { models?: unknown }).models;
  const name = Array.isArray(models) ? (models[0] as { name?: unknown } | undefined)?.name : undefined;
  return typeof name === 'string' ? name : null;
}

export const searchReplayRoutes: FastifyPluginAsyncZod<{ store: AuditStore; policy: ActivePolicy; compute: ComputeService }> = async (app, { store, policy, compute }) => {
  app.post('/v1/searches/:id/replay', {
    // Clients that always send a JSON content type may send it with no body at all.
    config: { emptyBody: true },
    schema: {
      tags: ['searches'],
      summary: 'Re-run a stored search with today\'s code and report which values changed and by how much',
      description: [
        'Send no body (an empty body with a JSON content type is accepted too). The stored request is validated again under today\'s schema, priced and run on the compute pool like a new search under the team policy in force today, and every number, string, boolean and null of the result is compared with the stored one; models are matched by name, so a subset that moved shows as a change of its place. `policy` says whether that policy is the one recorded (same hash).',
        'What a run measures rather than computes is left out of the comparison: `threads`, `budget.elapsedMs` and `budget.nodes` (branch-and-bound workers share their best bound, so the nodes visited depend on timing).',
        'A replay appends no audit record and returns no new result id: it checks a record against today\'s code. To put today\'s answer on the record, POST the stored request to /v1/searches.',
        '409 when the record kept only the request digest, or the stored request is no longer valid or computable today (the problem lists why); 422 when it is over today\'s limits or runs past COMPUTE_DEADLINE_MS.',
      ].join('\n\n'),
      params: RecordParams,
      response: { 200: ReplayReport, 400: ProblemSchema, 404: ProblemSchema, 409: ProblemSchema, 422: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const record = await getRecord(store, request.params.id, reply, 'search');
    if (!record) return reply;
    const body = storedRequest(reply, record, SearchRequest);
    if (!body) return reply;
    const priced = priceSearchRequest(body, compute.caps, compute.pool.size);
    if ('issues' in priced) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(priced.issues));
    const watch = watchClient(reply);
    let outcome;
    try {
      outcome = await inSession(compute.pool, reply, watch, (session) => computeSearch(session, { body, policy, budget: priced.budget, compute }));
    } finally {
      watch.stop();
    }
    if (outcome === CLIENT_GONE || watch.gone) return reply;
    if ('problem' in outcome || 'issues' in outcome) return notComputable(reply, record.id, outcome);
    const stored = { ...record, result: withoutRunMeasures(record.result) };
    const today = withoutRunMeasures(outcome.answer) as typeof outcome.answer;
    request.log.info({ id: record.id }, 'search replayed');
    return reply.code(200).send(replayReport(stored, today, firstModel));
  });
};
