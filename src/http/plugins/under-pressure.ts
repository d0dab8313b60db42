// Load shedding: while the event loop lags more than EVENT_LOOP_MAX_DELAY_MS,
// new requests get a 503 at once instead of queueing behind the work that is
// already late. Health probes are answered regardless: a busy replica is alive.
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import underPressure from '@fastify/under-pressure';
import { PROBLEM_CONTENT_TYPE, type Problem } from '../problems.ts';
import { refusal, refusalTypes } from './refusal.ts';

// under-pressure sends whatever the handler returns (and goes on when it returns
// nothing); its typings only admit void.
type PressureHandler = (request: FastifyRequest, reply: FastifyReply, type: string, value: number | undefined) => void;

const RETRY_AFTER_SECONDS = 2;

export async function registerLoadShedding(app: FastifyInstance, maxDelayMs: number): Promise<void> {
  if (maxDelayMs === 0) return;
  await app.register(underPressure, {
    maxEventLoopDelay: maxDelayMs,
    // Sample often enough that shedding starts and stops within a fraction of the limit.
    sampleInterval: Math.min(1000, Math.max(50, Math.round(maxDelayMs / 2))),
    retryAfter: RETRY_AFTER_SECONDS,
    pressureHandler: ((request: FastifyRequest, reply: FastifyReply, type: string, value: number | undefined): Problem | undefined => {
      if (request.routeOptions.url === '/healthz') return undefined;
      const lag = typeof value === 'number' ? Math.round(value) : null;
      const r = refusal(503, refusalTypes.overloaded, 'Service overloaded',
        `the event loop lags ${lag ?? 'more than'} ms, over the limit of ${maxDelayMs} ms (EVENT_LOOP_MAX_DELAY_MS); retry after ${RETRY_AFTER_SECONDS} s`,
        { limit: maxDelayMs, setting: 'EVENT_LOOP_MAX_DELAY_MS', measure: type, observed: lag },
        { 'retry-after': String(RETRY_AFTER_SECONDS) });
      reply.code(503).headers(r.headers).type(PROBLEM_CONTENT_TYPE);
      return r.body;
    }) as unknown as PressureHandler,
  });
}
