// Error replies are RFC 9457 problem details, sent as application/problem+json;
// the route schemas describe their body, and this says so in the document
// (@fastify/swagger would otherwise list every response as application/json).
type Response = { description?: string; content?: Record<string, unknown> };
type Operation = { security?: unknown[]; requestBody?: { content?: Record<string, unknown> }; responses?: Record<string, Response> };
type Doc = { paths?: Record<string, Record<string, Operation>> };

const problemRef = { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } };

/** Refusals every keyed operation can meet, whatever its own schema says (README: access, limits). */
const REFUSALS: Record<string, string> = {
  401: 'No API key, or one the service does not know (WWW-Authenticate: Bearer).',
  403: 'The key lacks the role this operation needs (the problem names it).',
  408: 'The request was not received within REQUEST_TIMEOUT_MS.',
  429: 'The key exceeded RATE_LIMIT_PER_MINUTE, or this client address made more than AUTH_FAILURES_PER_MINUTE requests with a missing or unknown key (every keyed request from it waits out the minute). Retry-After says when to come back; the problem names the setting.',
  503: 'Shedding load (EVENT_LOOP_MAX_DELAY_MS), shutting down, or the audit store cannot take the record (Retry-After).',
};

/** What a 400 means for an operation that takes a JSON body (src/http/json-body.ts, validation.ts). */
const JSON_BODY_400 =
  'The body is not JSON, nests arrays and objects deeper than JSON_MAX_DEPTH (the problem names the depth, the limit and the path), writes a key twice in one object (I-JSON, RFC 7493), holds a refused key or text (__proto__, a lone UTF-16 surrogate, NUL), or does not match the schema. errors[].path names the place.';

/** Problem media types, and the refusals of the access and limit layers on every keyed operation. */
export function finishDocument<T>(document: T): T {
  for (const operations of Object.values((document as Doc).paths ?? {})) {
    for (const operation of Object.values(operations)) {
      const bad = operation?.responses?.['400'];
      if (bad && bad.description === 'Default Response' && operation.requestBody?.content?.['application/json']) bad.description = JSON_BODY_400;
      if (!operation || (Array.isArray(operation.security) && operation.security.length === 0)) continue;
      operation.responses ??= {};
      for (const [status, description] of Object.entries(REFUSALS)) {
        operation.responses[status] ??= { description, content: problemRef };
      }
    }
  }
  return problemMediaTypes(document);
}

export function problemMediaTypes<T>(document: T): T {
  const paths = (document as Doc).paths ?? {};
  for (const operations of Object.values(paths)) {
    for (const operation of Object.values(operations)) {
      for (const [status, response] of Object.entries(operation?.responses ?? {})) {
        const content = response?.content;
        const schema = (content?.['application/json'] as { schema?: { $ref?: string } } | undefined)?.schema;
        if (Number(status) >= 400 && content && schema?.$ref === '#/components/schemas/Problem') {
          content['application/problem+json'] = content['application/json'];
          delete content['application/json'];
        }
      }
    }
  }
  return document;
}
