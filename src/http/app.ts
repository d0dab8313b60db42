// buildApp wires plugins and routes; it never listens, so tests drive it with
// inject() and server.ts decides the socket.
import { randomUUID } from 'node:crypto';
import Fastify, { type FastifyBaseLogger, type FastifyInstance } from 'fastify';
import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import { serializerCompiler, type ZodTypeProvider } from 'fastify-type-provider-zod';
import type { Logger } from 'pino';
import type { Config } from '../config.ts';
import type { AuditStore } from '../audit/store.ts';
import type { ChainAtStart } from '../audit/chain-at-start.ts';
import { errorHandler } from './errors.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from './problems.ts';
import { zodValidatorCompiler } from './validation.ts';
import { registerJsonBody } from './json-body.ts';
import { openapiOptions } from './openapi-options.ts';
import { docsUiOptions } from './docs-ui.ts';
import { loadPolicyFile, type ActivePolicy } from '../policy-file.ts';
import { withRefusals } from './plugins/refusal.ts';
import { requestTimeoutOptions } from './plugins/request-timeout.ts';
import { registerServicePlugins } from './plugins/service-plugins.ts';
import { KeyRing } from './security/key-ring.ts';
import { loadKeysFile } from './security/keys-file.ts';
import { healthRoutes } from './routes/health.ts';
import { rootRoutes } from './routes/root.ts';
import { comparisonRoutes } from './routes/comparisons.ts';
import { recordRoutes } from './routes/records.ts';
import { pictureRoutes } from './routes/pictures.ts';
import { searchPictureRoutes } from './routes/search-pictures.ts';
import { lifePictureRoutes } from './routes/life-pictures.ts';
import { auditRoutes } from './routes/audit.ts';
import { replayRoutes } from './routes/replay.ts';
import { searchReplayRoutes } from './routes/search-replay.ts';
import { searchRoutes } from './routes/searches.ts';
import { summaryRoutes } from './streaming/summary-route.ts';
import { ComputePool } from '../compute/index.ts';
import { priceCaps } from './compute/caps.ts';
import type { ComputeService } from './compute/run.ts';
import { JOB_WORKER_MODULE } from './jobs/index.ts';

export interface AppDependencies {
  config: Config;
  store: AuditStore;
  logger?: Logger | false;
  /** API keys; when absent, read from config.apiKeysFile (none: open). */
  keys?: KeyRing;
  /** Report process-wide metrics (CPU, memory) on /metrics: server.ts only. */
  processMetrics?: boolean;
  /** The team policy; when absent, read from config.policyFile (none: the built-in default). */
  policy?: ActivePolicy;
  /**
   * The process-wide compute pool (server.ts starts it with the service). When
   * absent the app makes its own from config, starts its workers on first use
   * and stops them when it closes.
   */
  compute?: ComputePool;
  /** The chain head at start and what it was compared with (server.ts); shown on /readyz and /metrics. */
  chainAtStart?: ChainAtStart;
}

/** A pool sized and bounded by the configuration, running the jobs of http/jobs. */
export function computePoolFor(config: Config): ComputePool {
  return new ComputePool({
    size: config.computeWorkers,
    queueLength: config.computeQueueLength,
    deadlineMs: config.computeDeadlineMs,
    workerModule: JOB_WORKER_MODULE,
    // A backstop, not the bound: designs live in typed arrays outside this heap and are priced against
    // MAX_REQUEST_MEMORY_BYTES; the heap holds the request's copy and the answer being built.
    heapLimitMb: Math.max(256, Math.ceil(config.maxRequestMemoryBytes / 2 ** 20)),
    warmUp: config.computeWarmUp,
  });
}


export async function buildApp({ config, store, logger, keys, processMetrics, policy: givenPolicy, compute: givenPool, chainAtStart }: AppDependencies): Promise<FastifyInstance> {
  const policy = givenPolicy ?? loadPolicyFile(config.policyFile);
  const pool = givenPool ?? computePoolFor(config);
  const compute: ComputeService = { pool, inlineWork: config.computeInlineWork, caps: priceCaps(config), schemaCheck: config.responseSchemaCheck, comparisonsInFlight: 0 };
  const app = Fastify({
    loggerInstance: (logger || undefined) as FastifyBaseLogger | undefined,
    bodyLimit: config.bodyLimitBytes,
    genReqId: (req) => {
      const given = req.headers['x-request-id'];
      return typeof given === 'string' && /^[\w.-]{1,100}$/.test(given) ? given : randomUUID();
    },
    ajv: undefined,
    // request.ip: the client behind the listed proxies (TRUST_PROXY), else the socket's peer.
    trustProxy: config.trustProxy.length > 0 ? [...config.trustProxy] : false,
    ...requestTimeoutOptions(config.requestTimeoutMs),
    // Refused by our own onRequest hook instead, as a problem naming the reason.
    return503OnClosing: false,
  }).withTypeProvider<ZodTypeProvider>();

  registerJsonBody(app as unknown as FastifyInstance, { maxDepth: config.jsonMaxDepth });
  // The body exactly as sent (before schema defaults), for the audit record's request and digest.
  app.addHook('preValidation', async (request) => {
    request.sentBody = request.body;
  });
  app.setValidatorCompiler(zodValidatorCompiler);
  app.setSerializerCompiler(serializerCompiler);
  app.setErrorHandler(withRefusals(errorHandler(config.bodyLimitBytes)));
  app.setNotFoundHandler((request, reply) => {
    const body = problem(404, problemTypes.notFound, 'Not found', `no route ${request.method} ${request.url.split('?')[0]}`);
    return reply.code(404).type(PROBLEM_CONTENT_TYPE).send(body);
  });
  app.addHook('onSend', async (request, reply, payload) => {
    reply.header('x-request-id', request.id);
    return payload;
  });
  // Before every other route (the service plugins' /metrics included) so the
  // document lists them all.
  await app.register(swagger, openapiOptions);
  await registerServicePlugins(app as unknown as FastifyInstance, {
    config,
    keys: keys ?? (config.apiKeysFile ? loadKeysFile(config.apiKeysFile) : KeyRing.empty()),
    processMetrics,
  });

  await app.register(swaggerUi, docsUiOptions);
  app.metrics.watchPool(() => pool.stats());
  const countReplaced = () => app.metrics.computeWorkersReplaced.inc();
  pool.on('replaced', countReplaced);
  app.addHook('onClose', async () => {
    pool.off('replaced', countReplaced);
    if (!givenPool) await pool.close();
  });

  await app.register(rootRoutes);
  if (chainAtStart?.finding) app.metrics.recordChainFinding(chainAtStart.finding);
  await app.register(healthRoutes, { store, pool, chainAtStart });
  await app.register(comparisonRoutes, { store, config, policy, compute });
  await app.register(recordRoutes, { store });
  await app.register(pictureRoutes, { store });
  await app.register(searchPictureRoutes, { store });
  await app.register(lifePictureRoutes, { store });
  await app.register(auditRoutes, { store });
  await app.register(replayRoutes, { store, policy, compute });
  await app.register(searchReplayRoutes, { store, policy, compute });
  await app.register(searchRoutes, { store, config, policy, compute });
  await app.register(summaryRoutes, { bodyLimitBytes: config.summaryBodyLimitBytes, uploadsPerCaller: config.summaryUploadsPerCaller });

  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  return app as unknown as FastifyInstance;
}
