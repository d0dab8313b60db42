// A refusal by one of the service's own limits or checks: a problem document plus
// the headers that tell the caller what to do (WWW-Authenticate, Retry-After).
// Thrown from hooks; withRefusals() lets it through the error handler unchanged.
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import { problem, PROBLEM_CONTENT_TYPE, type Problem } from '../problems.ts';

export const refusalTypes = {
  unauthorized: 'urn:parsimetry:problem:unauthorized',
  forbidden: 'urn:parsimetry:problem:forbidden',
  rateLimited: 'urn:parsimetry:problem:rate-limited',
  uploadsInFlight: 'urn:parsimetry:problem:uploads-in-flight',
  overloaded: 'urn:parsimetry:problem:overloaded',
  requestTimeout: 'urn:parsimetry:problem:request-timeout',
  shuttingDown: 'urn:parsimetry:problem:shutting-down',
  computeBusy: 'urn:parsimetry:problem:compute-busy',
  computeDeadline: 'urn:parsimetry:problem:compute-deadline',
  computeMemory: 'urn:parsimetry:problem:compute-memory',
} as const;

export class Refusal extends Error {
  readonly statusCode: number;
  constructor(readonly body: Problem, readonly headers: Readonly<Record<string, string>> = {}) {
    super(body.detail);
    this.statusCode = body.status;
  }
}

export function refusal(status: number, type: string, title: string, detail: string,
  extra: Partial<Problem> = {}, headers: Record<string, string> = {}): Refusal {
  return new Refusal(problem(status, type, title, detail, extra), headers);
}

export function sendRefusal(reply: FastifyReply, r: Refusal): FastifyReply {
  return reply.code(r.body.status).headers(r.headers).type(PROBLEM_CONTENT_TYPE).send(r.body);
}

type ErrorHandler = (error: FastifyError, request: FastifyRequest, reply: FastifyReply) => unknown;

export function withRefusals(handler: ErrorHandler): ErrorHandler {
  return function handle(error, request, reply) {
    if (error instanceof Refusal) return sendRefusal(reply, error);
    return handler(error, request, reply);
  };
}
