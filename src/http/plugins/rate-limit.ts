// RATE_LIMIT_PER_MINUTE per caller: per API key id, or per client address when
// the service runs open on loopback. Runs after access control (a route-level
// onRequest hook, after the app-level ones), so the key id is known here and an
// unknown key never spends anyone's allowance.
import type { FastifyInstance } from 'fastify';
import rateLimit from '@fastify/rate-limit';
import { ANONYMOUS, callerKey } from '../security/access.ts';
import { accessFor } from '../security/route-roles.ts';
import { refusal, refusalTypes } from './refusal.ts';

const WINDOW_MS = 60_000;

export async function registerRateLimit(app: FastifyInstance, perMinute: number): Promise<void> {
  await app.register(rateLimit, {
    global: true,
    max: perMinute,
    timeWindow: WINDOW_MS,
    keyGenerator: callerKey,
    // Probes, documentation and scrapes are not work; a load balancer polling
    // /readyz must never be told to back off.
    allowList: (request) => {
      const url = request.routeOptions.url;
      if (url === undefined) return false;
      const access = accessFor(request.method, url);
      return access.kind === 'public' || access.kind === 'any-key';
    },
    errorResponseBuilder: (request, context) => {
      const seconds = Math.max(1, Math.ceil(context.ttl / 1000));
      return refusal(429, refusalTypes.rateLimited, 'Rate limit exceeded',
        `${request.caller === ANONYMOUS ? 'this client' : `the key "${request.caller}"`} has made more than ${context.max} requests in a minute (RATE_LIMIT_PER_MINUTE=${context.max}); retry after ${seconds} s`,
        { limit: context.max, setting: 'RATE_LIMIT_PER_MINUTE', retryAfterSeconds: seconds },
        { 'retry-after': String(seconds) });
    },
  });
}
