// Liveness says the process answers; readiness says it can also keep records,
// because a result without its audit record is never sent.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { AuditStore } from '../../audit/store.ts';

const Health = z.strictObject({ status: z.enum(['ok', 'unready']), auditStore: z.string().optional() });

export const healthRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/healthz', {
    schema: {
      tags: ['operations'], summary: 'Liveness', security: [], response: { 200: Health },
      description: 'Always 200 while the process answers requests; for a container\'s liveness probe. It does not touch the audit store: see /readyz.',
    },
  }, async () => ({ status: 'ok' as const }));

  app.get('/readyz', {
    schema: {
      tags: ['operations'], summary: 'Readiness: the audit store takes records', security: [], response: { 200: Health, 503: Health },
      description: '200 when the audit store answers and its last write (or a write probe after a failure) succeeded; 503 otherwise, because no result is sent without its audit record. For a load balancer\'s readiness check.',
    },
  }, async (_request, reply) => {
    const ready = await store.ready().catch(() => false);
    return reply.code(ready ? 200 : 503).send({ status: ready ? 'ok' : 'unready', auditStore: store.backend });
  });
};
