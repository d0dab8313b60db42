// The one place a route hands a record to the audit store. A store that cannot
// take the record turns the reply into a 503: the caller never gets a result the
// team's record does not hold.
import type { FastifyReply } from 'fastify';
import type { AuditStore, NewRecord, StoredRecord, WrittenTexts } from '../audit/store.ts';
import type { Config } from '../config.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from './problems.ts';

export async function appendOr503(store: AuditStore, reply: FastifyReply, record: NewRecord, written?: WrittenTexts): Promise<StoredRecord | null> {
  const metrics = reply.server.metrics;
  const stopTimer = metrics?.auditAppendDuration.startTimer();
  try {
    const stored = await store.append(record, written);
    stopTimer?.();
    return stored;
  } catch (error) {
    metrics?.auditAppendFailures.inc();
    reply.log.error({ err: error }, 'audit store refused a record');
    const body = problem(503, problemTypes.storeUnavailable, 'Audit store unavailable',
      'the comparison was computed but could not be recorded, so no result is returned; retry later');
    reply.code(503).header('retry-after', '5').type(PROBLEM_CONTENT_TYPE).send(body);
    return null;
  }
}

/** The request as the audit record keeps it: whole, or (AUDIT_REQUESTS=digest) only by its digest. */
export function keptRequest(config: Pick<Config, 'auditRequests'>, body: unknown): Record<string, unknown> | null {
  return config.auditRequests === 'full' ? (body as Record<string, unknown>) : null;
}
