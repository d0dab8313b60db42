// The JSON body parser. Besides JSON itself it refuses, with the path of the
// offender: nesting deeper than JSON_MAX_DEPTH (checked on the text, before
// JSON.parse allocates anything), an object key written twice (I-JSON, RFC
// 7493 §2.3: the meaning of such an object is not interoperable, and
// JSON.parse would silently keep the last), keys that could pollute
// prototypes, lone UTF-16 surrogates and U+0000 (body/value-walk.ts says why).
//
// Speed: JSON.parse does the parsing; the text scan and the walk add a small
// fraction on a columnar body (scripts/bench-json-body.ts, README: Speed). The
// slow token walk that names a path runs only on a body being refused.
import type { FastifyInstance } from 'fastify';
import { toPointer } from './problems.ts';
import { locateInJson } from './body/locate.ts';
import { scanJsonText } from './body/text-scan.ts';
import { textNeedsChecks, walkValue } from './body/value-walk.ts';
import { nonJsonNumber } from './non-json-numbers.ts';

export type BodyRefusalKind = 'invalid-json' | 'unsafe-key' | 'bad-text' | 'too-deep' | 'duplicate-key';

export class BodyRefused extends Error {
  readonly statusCode = 400;
  constructor(
    readonly kind: BodyRefusalKind,
    readonly path: string | null,
    detail: string,
    /** Facts for the problem document (the limit and the setting that sets it). */
    readonly facts: Readonly<Record<string, unknown>> = {},
  ) {
    super(detail);
  }
}

declare module 'fastify' {
  interface FastifyRequest {
    /** The JSON body exactly as sent, before schema defaults: what the audit record keeps and digests. */
    sentBody?: unknown;
  }
}

/** The body as a value, or the refusal; pure, for tests and the benchmark. */
export function parseJsonBody(text: string, maxDepth: number): { value: unknown } | { refused: BodyRefused } {
  if (text.trim() === '') return { refused: new BodyRefused('invalid-json', null, 'the body is empty; send a JSON object') };
  const scan = scanJsonText(text, maxDepth);
  if (scan.tooDeepAt !== null) {
    const located = locateInJson(text, { containerAt: scan.tooDeepAt });
    if (located) {
      const depth = located.path.length + 1;
      return {
        refused: new BodyRefused('too-deep', toPointer(located.path),
          `the body nests containers ${depth} levels deep here; the limit is ${maxDepth} (JSON_MAX_DEPTH)`,
          { depth, limit: maxDepth, setting: 'JSON_MAX_DEPTH' }),
      };
    }
    // Not located: the text is not JSON either, and JSON.parse says where.
  }
  let value: unknown;
  try {
    // JSON.parse makes "__proto__" an own property (it never sets the
    // prototype), so the walk sees it and refuses it.
    value = JSON.parse(text);
  } catch (error) {
    // NaN, Infinity and the like (written by some JSON encoders) get a message that says what to send instead.
    const token = nonJsonNumber(text);
    if (token) {
      const what = `${token.token} is not a JSON number: use null for a missing value (and a finite number otherwise)`;
      return { refused: new BodyRefused('invalid-json', token.path, token.path === null ? `the body is not valid JSON: ${what}` : what) };
    }
    return { refused: new BodyRefused('invalid-json', null, `the body is not valid JSON: ${(error as Error).message}`) };
  }
  const walk = walkValue(value, textNeedsChecks(text));
  if (walk.refusal) return { refused: new BodyRefused(walk.refusal.kind, toPointer(walk.refusal.path), walk.refusal.message) };
  if (walk.keys < scan.keysAtLeast) {
    // Fewer keys parsed than may have been written: find out exactly.
    const located = locateInJson(text, { duplicateKey: true });
    if (located) {
      const key = String(located.path[located.path.length - 1]);
      return {
        refused: new BodyRefused('duplicate-key', toPointer(located.path),
          `the key ${JSON.stringify(key)} appears twice in the same object; send each key once (I-JSON, RFC 7493)`),
      };
    }
  }
  return { value };
}

/** maxDepth: JSON_MAX_DEPTH (src/config.ts has the default and why). */
export function registerJsonBody(app: FastifyInstance, { maxDepth }: { maxDepth: number }): void {
  app.removeContentTypeParser(['application/json', 'text/plain']);
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (request, body, done) => {
    const text = body as string;
    // A route that takes no body (replay) accepts an empty one, whatever the content type says.
    if (text.trim() === '' && (request.routeOptions.config as { emptyBody?: boolean } | undefined)?.emptyBody) {
      done(null, undefined);
      return;
    }
    const parsed = parseJsonBody(text, maxDepth);
    if ('refused' in parsed) done(parsed.refused, undefined);
    else done(null, parsed.value);
  });
}
