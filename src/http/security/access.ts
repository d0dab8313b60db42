// Enforces route-roles.ts on every request, before the body is read: 401 for a
// missing or unknown key (with WWW-Authenticate: Bearer, RFC 6750 §3), 403 for a
// known key that lacks the role, naming the role. The key id becomes
// request.caller, the caller written into audit records. Every 401 counts
// against the client address (failed-authentications.ts); past
// AUTH_FAILURES_PER_MINUTE the address gets 429 before any key is looked at.
import type { FastifyInstance, FastifyRequest } from 'fastify';
import { refusal, refusalTypes, type Refusal } from '../plugins/refusal.ts';
import { FailedAuthentications } from './failed-authentications.ts';
import type { KeyRing } from './key-ring.ts';
import { accessFor } from './route-roles.ts';

export const ANONYMOUS = 'anonymous';

declare module 'fastify' {
  interface FastifyRequest {
    /** The API key id that authenticated this request, or "anonymous". */
    caller: string;
  }
  interface FastifyInstance {
    /** Every route as registered ("GET /v1/comparisons/:id"), for the route-table check. */
    registeredRoutes: ReadonlyArray<{ method: string; url: string }>;
  }
}

/** Who a per-caller limit counts against: the API key id, or the client address when the service runs open. */
export function callerKey(request: FastifyRequest): string {
  return request.caller === ANONYMOUS ? `ip:${request.ip}` : `key:${request.caller}`;
}

function bearerToken(request: FastifyRequest): string | null {
  const header = request.headers.authorization;
  if (typeof header !== 'string') return null;
  const match = /^Bearer[ ]+([\x21-\x7e]+)[ ]*$/i.exec(header);
  return match ? match[1] : null;
}

function unauthorized(detail: string, error: 'invalid_request' | 'invalid_token'): Refusal {
  return refusal(401, refusalTypes.unauthorized, 'API key required', detail, {},
    { 'www-authenticate': `Bearer realm="parsimetry", error="${error}"` });
}

function tooManyFailures(perMinute: number, seconds: number): Refusal {
  return refusal(429, refusalTypes.rateLimited, 'Too many failed authentications',
    `this client address has sent ${perMinute} requests with a missing or unknown API key within a minute (AUTH_FAILURES_PER_MINUTE=${perMinute}); every request from it that needs a key is refused until the minute is over: retry after ${seconds} s`,
    { limit: perMinute, setting: 'AUTH_FAILURES_PER_MINUTE', retryAfterSeconds: seconds },
    { 'retry-after': String(seconds) });
}

export function installAccessControl(app: FastifyInstance, keys: KeyRing, options: { authFailuresPerMinute: number }): void {
  const failures = new FailedAuthentications(options.authFailuresPerMinute);
  const routes: { method: string; url: string }[] = [];
  app.decorate('registeredRoutes', routes);
  app.addHook('onRoute', (route) => {
    const methods = Array.isArray(route.method) ? route.method : [route.method];
    for (const method of methods) routes.push({ method, url: route.url });
  });

  app.decorateRequest('caller', ANONYMOUS);
  app.addHook('onRequest', async (request) => {
    request.caller = ANONYMOUS;
    if (keys.open) return;
    const url = request.routeOptions.url;
    // No route matched: the 404 handler answers and discloses nothing protected.
    if (url === undefined) return;
    const access = accessFor(request.method, url);
    if (access.kind === 'public') return;

    const wait = failures.retryAfterSeconds(request.ip);
    if (wait > 0) throw tooManyFailures(failures.perMinute, wait);
    const token = bearerToken(request);
    if (token === null) {
      failures.record(request.ip);
      throw unauthorized('send an API key as "Authorization: Bearer <key>" (keys are configured by API_KEYS_FILE)', 'invalid_request');
    }
    const key = keys.identify(token);
    if (key === null) {
      failures.record(request.ip);
      throw unauthorized('the API key is not one of the configured keys (API_KEYS_FILE)', 'invalid_token');
    }
    request.caller = key.id;
    if (access.kind === 'role' && !key.roles.has(access.role)) {
      throw refusal(403, refusalTypes.forbidden, 'Role required',
        `the key "${key.id}" lacks the role "${access.role}" that ${request.method} ${url} needs`,
        { requiredRole: access.role });
    }
  });
}
