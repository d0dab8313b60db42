// Where a request's work runs. A comparison priced within COMPUTE_INLINE_WORK
// runs on the main thread (a worker round trip would cost more than the
// work) unless other comparisons are in flight and a worker of the pool is
// idle: then the main thread has their records and answers to write, and the
// worker computes this one beside it (the same pure function, so the same
// numbers; measured by scripts/bench-http.ts). Everything else — larger comparisons, replays, every search — runs in
// a session of the process-wide pool: admitted or refused at once (503),
// stopped at its deadline (422) or when its client goes away. Refusals are
// thrown as Refusal, so the error handler answers them like any other.
import type { FastifyReply } from 'fastify';
import { ComputeCancelled, type ComputePool, type ComputeSession } from '../../compute/index.ts';
import type { PriceCaps } from '../../core/pricing/index.ts';
import { comparisonJob, type ComparisonJob, type ComparisonJobOutcome } from '../jobs/comparison-job.ts';
import { forWorker } from '../jobs/transport.ts';
import type { ClientWatch } from './client-gone.ts';
import { computeRefusal } from './refusals.ts';

/** The client went away before its answer: nothing is recorded and nothing is sent. */
export const CLIENT_GONE = Symbol('client gone');

export interface ComputeService {
  pool: ComputePool;
  /** Work (estimated multiply-adds) at or below which a comparison runs on the main thread. */
  inlineWork: number;
  caps: PriceCaps;
  /** RESPONSE_SCHEMA_CHECK: hold every result to its response schema before it is recorded (tests), or trust the code's own shape (production). */
  schemaCheck: boolean;
  /** Comparisons (POSTs and replays) between their pricing and their answer, this process. */
  comparisonsInFlight: number;
}

/** Counts one comparison in flight until `done` is called (once, in a finally). */
export function comparisonStarted(service: ComputeService): () => void {
  service.comparisonsInFlight++;
  let counted = true;
  return () => {
    if (counted) service.comparisonsInFlight--;
    counted = false;
  };
}

/** Inline-priced work stays on the main thread unless others keep it busy and a worker is free. */
function runsInline(service: ComputeService, work: number): boolean {
  if (work > service.inlineWork) return false;
  return service.comparisonsInFlight <= 1 || !service.pool.hasIdleWorker();
}

export async function inSession<T>(
  pool: ComputePool,
  reply: FastifyReply,
  watch: ClientWatch,
  work: (session: ComputeSession) => Promise<T>,
): Promise<T | typeof CLIENT_GONE> {
  const metrics = reply.server.metrics;
  let session: ComputeSession;
  try {
    session = pool.open();
  } catch (error) {
    metrics?.computeRefusals.inc({ reason: 'busy' });
    throw computeRefusal(error) ?? error;
  }
  watch.onGone(() => session.cancel());
  try {
    return await work(session);
  } catch (error) {
    if (error instanceof ComputeCancelled) {
      metrics?.computeRefusals.inc({ reason: 'client_gone' });
      return CLIENT_GONE;
    }
    const refused = computeRefusal(error);
    if (refused) metrics?.computeRefusals.inc({ reason: refused.body.status === 503 ? 'busy' : refused.body.type.split(':').at(-1)! });
    throw refused ?? error;
  } finally {
    session.close();
  }
}

/** One comparison (a POST or a replay), priced at `work`. */
export async function computeComparisonJob(
  service: ComputeService,
  reply: FastifyReply,
  watch: ClientWatch,
  job: ComparisonJob,
  work: number,
): Promise<ComparisonJobOutcome | typeof CLIENT_GONE> {
  if (runsInline(service, work)) {
    const outcome = comparisonJob(job);
    return watch.gone ? CLIENT_GONE : outcome;
  }
  const outcome = await inSession(service.pool, reply, watch, (session) => session.run<ComparisonJobOutcome>(forWorker(job)));
  return watch.gone ? CLIENT_GONE : outcome;
}
