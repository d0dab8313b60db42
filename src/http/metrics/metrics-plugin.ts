// Counts every reply by the route pattern (never the raw URL: ids would explode
// the label set) and serves GET /metrics in Prometheus text format.
import type { FastifyInstance } from 'fastify';
import { createServiceMetrics, type ServiceMetrics } from './service-metrics.ts';

declare module 'fastify' {
  interface FastifyInstance {
    metrics: ServiceMetrics;
  }
}

export function installMetrics(app: FastifyInstance, options: { processMetrics?: boolean } = {}): ServiceMetrics {
  const metrics = createServiceMetrics(options);
  app.decorate('metrics', metrics);
  app.addHook('onResponse', async (request, reply) => {
    const labels = {
      route: request.routeOptions.url ?? 'unmatched',
      method: request.method,
      status: String(reply.statusCode),
    };
    metrics.httpRequests.inc(labels);
    metrics.httpDuration.observe(labels, reply.elapsedTime / 1000);
  });
  app.get('/metrics', {
    schema: {
      tags: ['operations'],
      summary: 'Prometheus text exposition; needs an API key with any role when keys are configured',
      description: 'Request counts and durations by route and status, comparisons, searches and models fitted, audit append durations and failures (README: operations). Public when no keys are configured.',
    },
  }, async (_request, reply) => {
    const text = await metrics.registry.metrics();
    return reply.type(metrics.registry.contentType).send(text);
  });
  return metrics;
}
