// buildApp wires plugins and routes; it never listens, so tests drive it with
// inject() and server.ts decides the socket.
import { randomUUID } from 'node:crypto';
import Fastify, { type FastifyBaseLogger, type FastifyInstance } from 'fastify';
import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import {
  jsonSchemaTransform,
  jsonSchemaTransformObject,
  serializerCompiler,
  type ZodTypeProvider,
} from 'fastify-type-provider-zod';
import type { Logger } from 'pino';
import type { Config } from '../config.ts';
import type { AuditStore } from '../audit/store.ts';
import { serviceVersion } from '../version.ts';
import { errorHandler } from './errors.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from './problems.ts';
import { zodValidatorCompiler } from './validation.ts';
import { healthRoutes } from './routes/health.ts';
import { comparisonRoutes } from './routes/comparisons.ts';

export interface AppDependencies {
  config: Config;
  store: AuditStore;
  logger?: Logger | false;
}

export const openapiInfo = {
  title: 'parsimetry',
  version: serviceVersion,
  description:
    'One referee for competing regression models: fits candidates, scores every criterion under one published convention, ranks them and keeps a tamper-evident audit record. Criteria rank candidate models; they do not validate a model for a safety-relevant use — defer to domain review and local rules.',
};

export async function buildApp({ config, store, logger }: AppDependencies): Promise<FastifyInstance> {
  const app = Fastify({
    loggerInstance: (logger || undefined) as FastifyBaseLogger | undefined,
    bodyLimit: config.bodyLimitBytes,
    genReqId: (req) => {
      const given = req.headers['x-request-id'];
      return typeof given === 'string' && /^[\w.-]{1,100}$/.test(given) ? given : randomUUID();
    },
    // Proto-polluting keys are refused outright rather than silently stripped.
    onProtoPoisoning: 'error',
    onConstructorPoisoning: 'error',
    ajv: undefined,
  }).withTypeProvider<ZodTypeProvider>();

  app.setValidatorCompiler(zodValidatorCompiler);
  app.setSerializerCompiler(serializerCompiler);
  app.setErrorHandler(errorHandler(config.bodyLimitBytes));
  app.setNotFoundHandler((request, reply) => {
    const body = problem(404, problemTypes.notFound, 'Not found', `no route ${request.method} ${request.url.split('?')[0]}`);
    return reply.code(404).type(PROBLEM_CONTENT_TYPE).send(body);
  });
  app.addHook('onSend', async (request, reply, payload) => {
    reply.header('x-request-id', request.id);
    return payload;
  });

  await app.register(swagger, {
    openapi: {
      openapi: '3.1.0',
      info: openapiInfo,
      tags: [
        { name: 'comparisons', description: 'Fit, score and rank candidate models' },
        { name: 'operations', description: 'Health and readiness' },
      ],
    },
    transform: jsonSchemaTransform,
    transformObject: jsonSchemaTransformObject,
  });
  await app.register(swaggerUi, { routePrefix: '/docs' });

  await app.register(healthRoutes, { store });
  await app.register(comparisonRoutes, { store, config });

  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  return app as unknown as FastifyInstance;
}
