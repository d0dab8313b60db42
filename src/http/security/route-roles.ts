// Who may call what: one table, keyed by method and the URL pattern exactly as
// fastify registers it. Default-deny: a route missing here needs 'admin', and
// test/http/security/role-matrix.test.ts fails for any such route, so a new route
// cannot be exposed by forgetting this file.
export const ROLES = ['score', 'read', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export type Access =
  | { kind: 'public' }
  /** Any configured key, whatever its roles; public when no keys are configured. */
  | { kind: 'any-key' }
  | { kind: 'role'; role: Role };

const PUBLIC: Access = { kind: 'public' };
const role = (r: Role): Access => ({ kind: 'role', role: r });

export const routeRoles: Readonly<Record<string, Access>> = Object.freeze({
  'GET /': PUBLIC,
  'GET /healthz': PUBLIC,
  'GET /readyz': PUBLIC,
  'GET /openapi.json': PUBLIC,
  // CORS preflights never carry credentials (Fetch standard), so they must pass.
  'OPTIONS *': PUBLIC,
  'GET /metrics': { kind: 'any-key' },
  'POST /v1/comparisons': role('score'),
  'POST /v1/searches': role('score'),
  'POST /v1/summaries': role('score'),
  'GET /v1/comparisons': role('read'),
  'GET /v1/comparisons/:id': role('read'),
  'GET /v1/searches': role('read'),
  'GET /v1/searches/:id': role('read'),
  'GET /v1/searches/:id/chart.svg': role('read'),
  'GET /v1/searches/:id/report': role('read'),
  'GET /v1/audit/records/:id': role('read'),
  'GET /v1/comparisons/:id/chart.svg': role('read'),
  'GET /v1/comparisons/:id/report': role('read'),
  'GET /v1/comparisons/:id/life.svg': role('read'),
  'GET /v1/audit/verify': role('admin'),
  'POST /v1/comparisons/:id/replay': role('admin'),
  'POST /v1/searches/:id/replay': role('admin'),
});

/** Everything the interactive documentation serves (its page, assets, JSON and YAML). */
const PUBLIC_PREFIXES = ['/docs'];

export const DEFAULT_ACCESS: Access = role('admin');

export function isListed(method: string, url: string): boolean {
  return routeKey(method, url) in routeRoles || isPublicPrefix(url);
}

function isPublicPrefix(url: string): boolean {
  return PUBLIC_PREFIXES.some((p) => url === p || url.startsWith(`${p}/`));
}

function routeKey(method: string, url: string): string {
  // fastify answers HEAD for every GET route; the two share one rule.
  return `${method === 'HEAD' ? 'GET' : method} ${url}`;
}

export function accessFor(method: string, url: string): Access {
  if (isPublicPrefix(url)) return PUBLIC;
  return routeRoles[routeKey(method, url)] ?? DEFAULT_ACCESS;
}
