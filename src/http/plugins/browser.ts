// What browsers are told: security headers on every reply (helmet), and CORS for
// exactly the origins in CORS_ORIGINS (none by default).
import type { FastifyInstance } from 'fastify';
import helmet from '@fastify/helmet';
import cors from '@fastify/cors';

export async function registerBrowserPolicy(app: FastifyInstance, origins: ReadonlyArray<string>): Promise<void> {
  await app.register(helmet, {
    // A dashboard on another port of the same site may embed chart.svg.
    crossOriginResourcePolicy: { policy: 'same-site' },
    // helmet's default policy, without upgrade-insecure-requests: behind no TLS
    // (a loopback or lab deployment on plain HTTP) it would send /docs' own
    // assets to https and break the page. TLS, where used, is the proxy's job.
    contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } },
  });
  const allowed = new Set(origins);
  await app.register(cors, {
    origin: (origin, callback) => callback(null, origin !== undefined && allowed.has(origin)),
    methods: ['GET', 'POST'],
    allowedHeaders: ['authorization', 'content-type', 'x-request-id'],
    exposedHeaders: ['x-request-id', 'retry-after', 'x-ratelimit-limit', 'x-ratelimit-remaining', 'x-ratelimit-reset'],
    maxAge: 600,
  });
}
