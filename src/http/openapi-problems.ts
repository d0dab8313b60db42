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
/** What the operations that compute can refuse, beyond their schema (README: limits). */
const COMPUTE_OPERATIONS: ReadonlyArray<[string, string]> = [['/v1/comparisons', 'post'], ['/v1/searches', 'post'], ['/v1/comparisons/{id}/replay', 'post'], ['/v1/searches/{id}/replay', 'post']];
const COMPUTE_REFUSALS: Record<string, string> = {
  413: 'The body exceeds BODY_LIMIT_BYTES.',
  422: 'Over a limit priced from the request\'s shape before any work — MAX_REQUEST_WORK, MAX_REQUEST_MEMORY_BYTES, MAX_DESIGN_COLUMNS, MAX_RESULT_BYTES (type urn:parsimetry:problem:work-limit, with the estimate, the limit and its setting) — or stopped at COMPUTE_DEADLINE_MS (urn:parsimetry:problem:compute-deadline) or out of a compute worker\'s heap (urn:parsimetry:problem:compute-memory); nothing is recorded. A new comparison or search is also refused with 422 when it is well-formed but cannot be computed (errors[] name each field).',
  503: 'Every compute worker is busy and COMPUTE_QUEUE_LENGTH requests already wait (urn:parsimetry:problem:compute-busy), the service is shedding load or shutting down, or the audit store cannot take the record; Retry-After says when to come back.',
};

/** Problem media types, and the refusals of the access and limit layers on every keyed operation. */
export function finishDocument<T>(document: T): T {
  for (const [path, method] of COMPUTE_OPERATIONS) {
    const responses = (document as Doc).paths?.[path]?.[method]?.responses ?? {};
    for (const [status, description] of Object.entries(COMPUTE_REFUSALS)) {
      if (responses[status]) responses[status].description = description;
    }
  }
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
