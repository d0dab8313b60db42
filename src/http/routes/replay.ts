// POST /v1/comparisons/{id}/replay: the stored request re-run with today's code,
// and every value of the result that came out differently.
//
// A replay appends no audit record. It hands out no new result to rely on (no id,
// nothing a dashboard would show as "the" answer); it is a read of a record
// already in the chain, checked against today's code. Recording reads would let
// anyone lengthen the chain without making a comparison. Whoever wants today's
// answer on the record POSTs the stored request to /v1/comparisons again.
import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { z } from 'zod';
import type { AuditStore, StoredRecord } from '../../audit/store.ts';
import type { Issue } from '../../core/issues.ts';
import { toJsonValue } from '../../audit/chain.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { diffResults, type JsonValue, type ValueChange } from '../../core/result-diff.ts';
import { serviceVersion } from '../../version.ts';
import { watchClient } from '../compute/client-gone.ts';
import { priceComparisonRequest } from '../compute/price-request.ts';
import { CLIENT_GONE, comparisonStarted, computeComparisonJob, type ComputeService } from '../compute/run.ts';
import { issuesProblem, problem, problemTypes, toPointer, PROBLEM_CONTENT_TYPE, type Problem } from '../problems.ts';
import { ComparisonRequest } from '../schemas/comparison-request.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { RecordParams, ReplayReport } from '../schemas/record.ts';
import { getComparison } from './records.ts';

const conflict = problemTypes.replayImpossible;

function largest(changes: ValueChange[]): ValueChange | null {
  let best: ValueChange | null = null;
  for (const c of changes) {
    if (c.relativeChange === null) continue;
    if (!best || Math.abs(c.relativeChange) > Math.abs(best.relativeChange!)) best = c;
  }
  return best;
}

/** The model a result puts first: a comparison's verdict.chosen, a search's first model. */
export type ChosenOf = (result: JsonValue) => string | null;

function verdictChosen(result: JsonValue): string | null {
  const verdict = (result as { verdict?: { chosen?: unknown } }).verdict;
  return typeof verdict?.chosen === 'string' ? verdict.chosen : null;
}

function summarise(changes: ValueChange[], compared: number, stored: JsonValue, now: JsonValue, chosenOf: ChosenOf): string {
  if (changes.length === 0) return `today's code reproduces all ${compared} values of the stored result exactly`;
  const parts = [`${changes.length} of ${compared} stored values differ`];
  const numeric = changes.filter((c) => c.absoluteChange !== null).length;
  if (numeric) parts.push(`${numeric} of them numbers`);
  const big = largest(changes);
  if (big) parts.push(`largest relative change ${big.relativeChange!.toPrecision(3)} at ${big.path}`);
  const added = changes.filter((c) => c.change === 'added').length;
  const removed = changes.filter((c) => c.change === 'removed').length;
  if (added || removed) parts.push(`${added} added and ${removed} removed entries`);
  const [before, after] = [chosenOf(stored), chosenOf(now)];
  parts.push(before === after ? `the chosen model is still ${after ?? 'none'}` : `the chosen model changes from ${before ?? 'none'} to ${after ?? 'none'}`);
  return `${parts.join('; ')}.`;
}

/** The stored request under today's schema, or null with the 409 sent (kept only as a digest, or no longer valid). */
export function storedRequest<T extends z.ZodType>(reply: FastifyReply, record: StoredRecord, schema: T): z.output<T> | null {
  if (record.request === null) {
    reply.code(409).type(PROBLEM_CONTENT_TYPE).send(problem(409, conflict, 'Nothing to replay',
      `${record.kind} ${record.id} was recorded digest-only: the request itself was not kept, so it cannot be run again`));
    return null;
  }
  const parsed = schema.safeParse(record.request);
  if (parsed.success) return parsed.data;
  const errors = parsed.error.issues.slice(0, 50).map((i) => ({ path: toPointer(i.path as PropertyKey[]), message: i.message, code: i.code }));
  reply.code(409).type(PROBLEM_CONTENT_TYPE).send(problem(409, conflict, 'Stored request no longer valid',
    `the stored request of ${record.id} does not pass today's request schema (${errors.length} problem${errors.length === 1 ? '' : 's'}; the first at ${errors[0].path || '(root)'}: ${errors[0].message})`,
    { errors }));
  return null;
}

/** The 409 when today's code cannot compute or represent the stored request. */
export function notComputable(reply: FastifyReply, id: string, outcome: { problem: Problem } | { issues: Issue[] }): FastifyReply {
  if ('problem' in outcome) {
    return reply.code(409).type(PROBLEM_CONTENT_TYPE).send(problem(409, conflict, 'Stored request no longer computes',
      `today's code cannot represent the result of the stored request of ${id}: ${outcome.problem.detail}`, { errors: outcome.problem.errors }));
  }
  const why = issuesProblem(outcome.issues);
  return reply.code(409).type(PROBLEM_CONTENT_TYPE).send(problem(409, conflict, 'Stored request no longer computes',
    `today's code cannot compute the stored request of ${id}: ${why.detail}`, { errors: why.errors }));
}

/** The stored result against today's, value by value (JSON with JSON: the stored side went through JSON on its way in). */
export function replayReport(
  record: StoredRecord,
  today: { conventions: { version: string }; policy: { name: string; hash: string } },
  chosenOf: ChosenOf,
) {
  const now = toJsonValue(today);
  const stored = record.result as JsonValue;
  const diff = diffResults(stored, now);
  return {
    id: record.id,
    replayedAt: new Date().toISOString(),
    serviceVersion: { stored: record.serviceVersion, now: serviceVersion },
    conventionsVersion: { stored: record.conventionsVersion, now: today.conventions.version },
    policy: { stored: record.policy, now: today.policy },
    identical: diff.changes.length === 0,
    valuesCompared: diff.leavesCompared,
    changes: diff.changes,
    summary: summarise(diff.changes, diff.leavesCompared, stored, now, chosenOf)
      + (record.policy?.hash === today.policy.hash ? '' : ' The team policy in force differs from the one recorded, so differences may come from the policy rather than the code.'),
  };
}

export const replayRoutes: FastifyPluginAsyncZod<{ store: AuditStore; policy: ActivePolicy; compute: ComputeService }> = async (app, { store, policy, compute }) => {
  app.post('/v1/comparisons/:id/replay', {
    // Clients that always send a JSON content type may send it with no body at all.
    config: { emptyBody: true },
    schema: {
      tags: ['audit'],
      summary: 'Re-run a stored comparison with today\'s code and report which values changed and by how much',
      description: [
        'Send no body (an empty body with a JSON content type is accepted too). The stored request is validated again under today\'s schema and computed again under the team policy in force today; every number, string, boolean and null of the result is compared with the stored one. `policy` says whether that policy is the one recorded (same hash).',
        'Models, ranking entries, coefficients and cautions are matched by name, term or code, so a model that moved in a ranking shows as a change of its rank, not of every entry.',
        'A replay appends no audit record and returns no new result id: it checks a record against today\'s code. To put today\'s answer on the record, POST the stored request to /v1/comparisons.',
        '409 when the record kept only the request digest, or the stored request is no longer valid or computable today (the problem lists why); 422 when it is over today\'s limits (priced like a new comparison) or runs past COMPUTE_DEADLINE_MS.',
      ].join('\n\n'),
      params: RecordParams,
      response: { 200: ReplayReport, 400: ProblemSchema, 404: ProblemSchema, 409: ProblemSchema, 422: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const record = await getComparison(store, request.params.id, reply);
    if (!record) return reply;
    const body = storedRequest(reply, record, ComparisonRequest);
    if (!body) return reply;
    const priced = priceComparisonRequest(body, policy, compute.caps);
    if ('issues' in priced) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(priced.issues));
    const watch = watchClient(reply);
    const done = comparisonStarted(compute);
    let outcome;
    try {
      const job = { kind: 'comparison', body, policy, resultCap: compute.caps.resultBytes, schemaCheck: compute.schemaCheck } as const;
      outcome = await computeComparisonJob(compute, reply, watch, job, priced.price.work);
    } finally {
      done();
      watch.stop();
    }
    if (outcome === CLIENT_GONE) return reply;
    if ('problem' in outcome || 'issues' in outcome) return notComputable(reply, record.id, outcome);
    return reply.code(200).send(replayReport(record, outcome.result, verdictChosen));
  });
};
