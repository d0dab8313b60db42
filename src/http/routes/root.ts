// GET /: where to start. A browser is sent on to the interactive
// documentation; any other client gets the same pointers as JSON.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { serviceVersion } from '../../version.ts';

const Start = z
  .strictObject({
    service: z.literal('parsimetry'),
    version: z.string(),
    docs: z.string().meta({ description: 'The interactive API documentation.' }),
    openapi: z.string().meta({ description: 'The OpenAPI 3.1 document.' }),
    comparisons: z.string(),
    health: z.string(),
  })
  .meta({ id: 'ServiceStart' });

export const rootRoutes: FastifyPluginAsyncZod = async (app) => {
  app.get('/', {
    schema: {
      tags: ['operations'],
      summary: 'Where to start: the documentation (a browser is redirected to /docs)',
      description: 'A browser (Accept: text/html) is redirected to the interactive documentation at /docs; any other client gets the service\'s version and links to the documentation, the OpenAPI document, the comparisons and the health check, with a Link header naming the first two.',
      security: [],
      response: { 200: Start, 302: z.null().meta({ description: 'Redirect to /docs for a client that accepts text/html.' }) },
    },
  }, async (request, reply) => {
    const accept = String(request.headers.accept ?? '');
    if (/\btext\/html\b/.test(accept)) return reply.code(302).header('location', '/docs').send(null);
    return reply.code(200).header('link', '</docs>; rel="service-doc", </openapi.json>; rel="service-desc"').send({
      service: 'parsimetry' as const,
      version: serviceVersion,
      docs: '/docs',
      openapi: '/openapi.json',
      comparisons: '/v1/comparisons',
      health: '/healthz',
    });
  });
};
