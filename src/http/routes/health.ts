// Liveness says the process answers; readiness says it can also keep records,
// because a result without its audit record is never sent. Readiness rests on
// a proven write (src/audit/write-proof.ts), not on a read: a store reopened on
// a full disk reads fine and refuses every append. A chain found behind the
// head last seen at start is shown here too (README: Lost records): the
// service can still keep records, so it stays ready, but an operator must look.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { describeFinding, type ChainAtStart } from '../../audit/chain-at-start.ts';
import type { AuditStore } from '../../audit/store.ts';
import type { ComputePool } from '../../compute/index.ts';

const Head = z.strictObject({ seq: z.number().int(), hash: z.string() });

const ChainWarning = z.strictObject({
  kind: z.enum(['behind', 'rewritten']).meta({ description: 'behind: records the head last seen had are missing; rewritten: as many records, a different newest one.' }),
  missing: z.number().int().meta({ description: 'Records missing at start (0 for rewritten).' }),
  headAtStart: Head,
  lastSeen: Head.extend({ seenAt: z.string() }).meta({ description: 'The head kept in the side file beside the SQLite store.' }),
  detail: z.string(),
}).meta({ description: 'Present when the start found the SQLite chain behind (or different from) the head last seen. README: Lost records says what to do.' });

const Health = z.strictObject({
  status: z.enum(['ok', 'unready']),
  auditStore: z.string().optional(),
  computeWorkers: z.enum(['starting']).optional().meta({ description: 'Present while the compute workers are still starting (loading and warming their code): the service is unready until the first one is ready, so a balancer sends no request that would wait for them.' }),
  chainWarning: ChainWarning.optional(),
});

export const healthRoutes: FastifyPluginAsyncZod<{ store: AuditStore; pool: ComputePool; chainAtStart?: ChainAtStart }> = async (app, { store, pool, chainAtStart }) => {
  const finding = chainAtStart?.finding ?? null;
  const chainWarning = finding === null ? undefined : {
    kind: finding.kind,
    missing: finding.missing,
    headAtStart: { seq: finding.current.seq, hash: finding.current.hash },
    lastSeen: { seq: finding.lastSeen.seq, hash: finding.lastSeen.hash, seenAt: finding.lastSeen.seenAt },
    detail: describeFinding(finding, chainAtStart?.witnessFile ?? null),
  };

  app.get('/healthz', {
    schema: {
      tags: ['operations'], summary: 'Liveness', security: [], response: { 200: Health },
      description: 'Always 200 while the process answers requests; for a container\'s liveness probe. It does not touch the audit store: see /readyz.',
    },
  }, async () => ({ status: 'ok' as const }));

  app.get('/readyz', {
    schema: {
      tags: ['operations'],
      summary: 'Readiness: the audit store takes records (a write is proven, probed when none is recent)',
      security: [],
      response: { 200: Health, 503: Health },
      description: '200 when the audit store answers and its last write (or a write probe after a failure) succeeded and a compute worker has started; 503 otherwise, because no result is sent without its audit record, and a request sent before any worker is up would wait for one (`computeWorkers: "starting"`). For a load balancer\'s readiness check.',
    },
  }, async (_request, reply) => {
    const starting = pool.starting();
    const ready = !starting && await store.ready().catch(() => false);
    return reply.code(ready ? 200 : 503).send({ status: ready ? 'ok' : 'unready', auditStore: store.backend, ...(starting ? { computeWorkers: 'starting' as const } : {}), chainWarning });
  });
};
