// The JSON body parser. Besides JSON itself it refuses, with the path of the
// first offender: keys that could pollute prototypes (__proto__, and a
// constructor holding prototype), strings that are not well-formed UTF-16 (a
// lone surrogate cannot be stored as UTF-8 text, so the audit record would no
// longer hash as it was hashed), and U+0000 (PostgreSQL text cannot hold it).
import type { FastifyInstance } from 'fastify';
import { toPointer } from './problems.ts';
import { nonJsonNumber } from './non-json-numbers.ts';

export class BodyRefused extends Error {
  readonly statusCode = 400;
  constructor(readonly kind: 'invalid-json' | 'unsafe-key' | 'bad-text', readonly path: string | null, detail: string) {
    super(detail);
  }
}

declare module 'fastify' {
  interface FastifyRequest {
    /** The JSON body exactly as sent, before schema defaults: what the audit record keeps and digests. */
    sentBody?: unknown;
  }
}

type Path = (string | number)[];

function firstProblem(value: unknown, path: Path): BodyRefused | null {
  if (typeof value === 'string') {
    if (!(value as unknown as { isWellFormed(): boolean }).isWellFormed()) return new BodyRefused('bad-text', toPointer(path), 'a string holds a lone UTF-16 surrogate, which is not text');
    if (value.includes('\u0000')) return new BodyRefused('bad-text', toPointer(path), 'a string holds the NUL character (U+0000)');
    return null;
  }
  if (value === null || typeof value !== 'object') return null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const v = value[i];
      // Numbers are most of a request's bulk; skip them without a call.
      if (typeof v === 'number' || v === null) continue;
      const p = firstProblem(v, [...path, i]);
      if (p) return p;
    }
    return null;
  }
  for (const key of Object.keys(value)) {
    const child = (value as Record<string, unknown>)[key];
    if (key === '__proto__' || (key === 'constructor' && child !== null && typeof child === 'object' && 'prototype' in child)) {
      return new BodyRefused('unsafe-key', toPointer([...path, key]), `the key "${key}" is refused: it could alter object prototypes`);
    }
    const bad = firstProblem(key, [...path, key]);
    if (bad) return bad;
    const p = firstProblem(child, [...path, key]);
    if (p) return p;
  }
  return null;
}

export function registerJsonBody(app: FastifyInstance): void {
  app.removeContentTypeParser(['application/json', 'text/plain']);
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
    const text = body as string;
    if (text.trim() === '') {
      // A route that takes no body (replay) accepts an empty one, whatever the content type says.
      if ((request.routeOptions.config as { emptyBody?: boolean } | undefined)?.emptyBody) done(null, undefined);
      else done(new BodyRefused('invalid-json', null, 'the body is empty; send a JSON object'), undefined);
      return;
    }
    let value: unknown;
    try {
      // JSON.parse makes "__proto__" an own property (it never sets the
      // prototype), so the walk below sees it and refuses it.
      value = JSON.parse(text);
    } catch (error) {
      const token = nonJsonNumber(text);
      if (token) {
        const what = `${token.token} is not a JSON number: use null for a missing value (and a finite number otherwise)`;
        done(new BodyRefused('invalid-json', token.path, token.path === null ? `the body is not valid JSON: ${what}` : what), undefined);
        return;
      }
      done(new BodyRefused('invalid-json', null, `the body is not valid JSON: ${(error as Error).message}`), undefined);
      return;
    }
    const problem = firstProblem(value, []);
    if (problem) done(problem, undefined);
    else done(null, value);
  });
}
