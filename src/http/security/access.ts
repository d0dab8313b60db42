// Enforces route-roles.ts on every request, before the body is read: 401 for a
// missing or unknown key (with WWW-Authenticate: Bearer, RFC 6750 §3), 403 for a
// known key that lacks the role, naming the role. The key id becomes
// request.caller, the caller written into audit records.
import type { FastifyInstance, FastifyRequest } from 'fastify';
import { refusal, refusalTypes, type Refusal } from '../plugins/refusal.ts';
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

export function installAccessControl(app: FastifyInstance, keys: KeyRing): void {
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

    const token = bearerToken(request);
    if (token === null) {
      throw unauthorized('send an API key as "Authorization: Bearer <key>" (keys are configured by API_KEYS_FILE)', 'invalid_request');
    }
    const key = keys.identify(token);
    if (key === null) throw unauthorized('the API key is not one of the configured keys (API_KEYS_FILE)', 'invalid_token');
    request.caller = key.id;
    if (access.kind === 'role' && !key.roles.has(access.role)) {
      throw refusal(403, refusalTypes.forbidden, 'Role required',
        `the key "${key.id}" lacks the role "${access.role}" that ${request.method} ${url} needs`,
        { requiredRole: access.role });
    }
  });
}
