// POST /v1/comparisons: validated body -> price -> core (inline or in the
// compute pool) -> audit record -> reply. The reply is sent only after the
// record is committed: no result without a record, and no record for a client
// that went away before its answer.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
import { canonicalJson, sha256Hex } from '../../audit/chain.ts';
import type { Config } from '../../config.ts';
import { serviceVersion } from '../../version.ts';
import { ComparisonRequest } from '../schemas/comparison-request.ts';
import { ComparisonResult } from '../schemas/comparison-response.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { issuesProblem, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { appendOr503, keptRequest } from '../audit-append.ts';
import { watchClient } from '../compute/client-gone.ts';
import { priceComparisonRequest } from '../compute/price-request.ts';
import { answerJson, answerSerializer, sendJsonText } from '../answer-serializer.ts';
import { CLIENT_GONE, comparisonStarted, computeComparisonJob, type ComputeService } from '../compute/run.ts';
import type { ActivePolicy } from '../../policy-file.ts';

export interface ComparisonRouteOptions {
  store: AuditStore;
  config: Config;
  policy: ActivePolicy;
  compute: ComputeService;
}

export const comparisonRoutes: FastifyPluginAsyncZod<ComparisonRouteOptions> = async (app, { store, config, policy, compute }) => {
  app.post('/v1/comparisons', {
    schema: {
      tags: ['comparisons'],
      summary: 'Fit and score candidate models on one data set, rank them and record the comparison',
      description: [
        'Send the data (`data.columns`, or `data.summary`), the `response` column and the `candidates`: terms for the service to fit, or residuals, an RSS or a log-likelihood of models fitted elsewhere. Every candidate is scored on the same rows under one convention (`conventions` in the answer), ranked by every criterion, and the comparison is appended to the audit chain before the answer is sent; its `id` reads it back.',
        'The example is the demo scenario (tile shrinkage, invented data): send it with "Try it out".',
        'Criteria rank the candidates against each other; they do not validate a model. Where a model is chosen for a safety-relevant use, defer to domain review and local rules.',
      ].join('\n\n'),
      body: ComparisonRequest,
      response: { 200: ComparisonResult, 400: ProblemSchema, 413: ProblemSchema, 415: ProblemSchema, 422: ProblemSchema, 503: ProblemSchema },
    },
    ...answerSerializer(config),
  }, async (request, reply) => {
    const body = request.body;
    const priced = priceComparisonRequest(body, policy, compute.caps);
    if ('issues' in priced) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(priced.issues));
    const watch = watchClient(reply);
    // Until the answer is sent: a comparison waiting on its record still needs the main thread.
    const done = comparisonStarted(compute);
    try {
      const job = { kind: 'comparison', body, policy, resultCap: compute.caps.resultBytes, schemaCheck: compute.schemaCheck } as const;
      const outcome = await computeComparisonJob(compute, reply, watch, job, priced.price.work);
      if (outcome === CLIENT_GONE) {
        request.log.info('comparison abandoned: the client went away before its answer; nothing recorded');
        return reply;
      }
      if ('issues' in outcome) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(issuesProblem(outcome.issues));
      if ('problem' in outcome) return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(outcome.problem);
      const result = outcome.result;
      // The request's canonical text serves its digest and the record's hash; the
      // result's text (written once, in the job) the record's row and the answer.
      const requestCanonical = canonicalJson(request.sentBody);
      const record = await appendOr503(store, reply, {
        kind: 'comparison',
        caller: request.caller,
        label: body.label ?? null,
        serviceVersion,
        conventionsVersion: result.conventions.version,
        policy: result.policy,
        datasetFingerprint: result.dataset.fingerprint,
        requestDigest: sha256Hex(requestCanonical),
        request: keptRequest(config, request.sentBody),
        result: result as unknown as Record<string, unknown>,
      }, { resultJson: outcome.resultJson, resultCanonical: outcome.resultCanonical, requestCanonical });
      if (!record) return reply;
      app.metrics.comparisons.inc();
      app.metrics.modelsFitted.inc(result.models.filter((m: { source?: string }) => m.source === 'fit').length);
      const envelope = { id: record.id, createdAt: record.createdAt, serviceVersion };
      // With RESPONSE_SCHEMA_CHECK on, the schema serializer writes (and checks) the answer itself.
      const text = config.responseSchemaCheck ? null : answerJson(envelope, result, outcome.resultJson);
      if (text !== null) return sendJsonText(reply, text);
      return reply.code(200).send({ ...envelope, ...result });
    } finally {
      done();
      watch.stop();
    }
  });
};
