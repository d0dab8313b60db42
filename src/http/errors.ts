// Turns every thrown error into problem details. Anything the caller sent gets a
// 4xx naming what was wrong; only our own faults become a 500, with no stack.
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import { ResponseSerializationError } from 'fastify-type-provider-zod';
import { problem, problemTypes, toPointer, PROBLEM_CONTENT_TYPE, type Problem } from './problems.ts';
import { RequestValidationError } from './validation.ts';
import { BodyRefused, type BodyRefusalKind } from './json-body.ts';

const BODY_REFUSAL_TITLES: Record<BodyRefusalKind, string> = {
  'invalid-json': 'Body is not JSON',
  'unsafe-key': 'The request holds a value that is refused',
  'bad-text': 'The request holds a value that is refused',
  'duplicate-key': 'The request repeats a key',
  'too-deep': 'The body nests too deeply',
};

function fromFastifyError(error: FastifyError, request: FastifyRequest, bodyLimitBytes: number): Problem | null {
  switch (error.code) {
    case 'FST_ERR_CTP_BODY_TOO_LARGE':
      return problem(413, problemTypes.bodyTooLarge, 'Request body too large',
        `the body exceeds the limit of ${bodyLimitBytes} bytes (BODY_LIMIT_BYTES); send a data.summary or split the data`,
        { limit: bodyLimitBytes });
    case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
      return problem(415, problemTypes.unsupportedMediaType, 'Unsupported media type',
        `send the body as application/json (got ${JSON.stringify(request.headers['content-type'] ?? 'none')})`);
    case 'FST_ERR_CTP_EMPTY_JSON_BODY':
      return problem(400, problemTypes.invalidJson, 'Body is not JSON', 'the body is empty; send a JSON object');
    case 'FST_ERR_CTP_INVALID_CONTENT_LENGTH':
      return problem(400, problemTypes.invalidJson, 'Body is not JSON', 'the Content-Length header does not match the body');
    default:
      break;
  }
  if (typeof error.statusCode === 'number' && error.statusCode >= 400 && error.statusCode < 500) {
    return problem(error.statusCode, problemTypes.invalidRequest, 'Request refused', error.message);
  }
  return null;
}

export function errorHandler(bodyLimitBytes: number) {
  return function handle(error: FastifyError, request: FastifyRequest, reply: FastifyReply) {
    let body: Problem | null = null;
    if (error instanceof BodyRefused) {
      body = problem(400, error.kind === 'invalid-json' ? problemTypes.invalidJson : problemTypes.invalidRequest,
        BODY_REFUSAL_TITLES[error.kind],
        error.path === null ? error.message : `${error.path || '(root)'}: ${error.message}`,
        error.path === null ? {} : { ...error.facts, errors: [{ path: error.path, message: error.message, code: error.kind, ...error.facts }] });
    } else if (error instanceof RequestValidationError) {
      body = problem(400, problemTypes.invalidRequest, 'The request does not match the schema', error.summary(), {
        errors: error.issues.map((i) => ({ path: toPointer(i.path), message: i.message, code: i.code })),
      });
    } else if (error instanceof ResponseSerializationError) {
      request.log.error({ err: error }, 'response did not match its schema');
    } else {
      body = fromFastifyError(error, request, bodyLimitBytes);
    }
    if (!body) {
      request.log.error({ err: error }, 'unhandled error');
      body = problem(500, problemTypes.internal, 'Internal error',
        `the service failed on its own account; quote request id ${request.id} when reporting it`);
    }
    return reply.code(body.status).type(PROBLEM_CONTENT_TYPE).send(body);
  };
}
