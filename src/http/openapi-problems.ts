// Error replies are RFC 9457 problem details, sent as application/problem+json;
// the route schemas describe their body, and this says so in the document
// (@fastify/swagger would otherwise list every response as application/json).
type Response = { description?: string; content?: Record<string, unknown> };
type Operation = { security?: unknown[]; responses?: Record<string, Response> };
type Doc = { paths?: Record<string, Record<string, Operation>> };

const problemRef = { 'application/problem+json': { schema: { $ref: '#/components/schemas/Problem' } } };

/** Refusals every keyed operation can meet, whatever its own schema says (README: access, limits). */
const REFUSALS: Record<string, string> = {
  401: 'No API key, or one the service does not know (WWW-Authenticate: Bearer).',
  403: 'The key lacks the role this operation needs (the problem names it).',
  408: 'The request was not received within REQUEST_TIMEOUT_MS.',
  429: 'The key exceeded RATE_LIMIT_PER_MINUTE (Retry-After says when to come back).',
  503: 'Shedding load (EVENT_LOOP_MAX_DELAY_MS), shutting down, or the audit store cannot take the record (Retry-After).',
};

/** Problem media types, and the refusals of the access and limit layers on every keyed operation. */
export function finishDocument<T>(document: T): T {
  for (const operations of Object.values((document as Doc).paths ?? {})) {
    for (const operation of Object.values(operations)) {
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
