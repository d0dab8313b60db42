// The last check before a result is recorded: every number must be a finite
// double. Extreme data can overflow (a PRESS of values near 1e160, weights
// spanning 1e-308..1e308); such a value is reported as null with a caution
// naming where. With the schema check on (RESPONSE_SCHEMA_CHECK=on, as every
// test runs), a result that still does not fit its response schema is refused
// with a 422 before anything is recorded — never a 500 after a record commits.
// In production the check is off: the result's shape is the code's own, which
// the tests hold to the schema, and the check cost more than the rest of the
// record's path together (a deep copy of a 38 KB result, about 0.8 ms).
import type { z } from 'zod';
import { isPlainJsonData } from '../audit/chain.ts';
import { problem, problemTypes, toPointer, type Problem } from './problems.ts';

function nullNonFinite(value: unknown, path: (string | number)[], found: string[]): unknown {
  if (typeof value === 'number') {
    if (Number.isFinite(value)) return value;
    found.push(toPointer(path));
    return null;
  }
  if (Array.isArray(value)) return value.map((v, i) => nullNonFinite(v, [...path, i], found));
  if (value !== null && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = nullNonFinite(v, [...path, k], found);
    return out;
  }
  return value;
}

export function representableResult<T extends { cautions: { code: string; message: string }[] }>(
  schema: z.ZodType,
  result: T,
  envelope: Record<string, unknown>,
  schemaCheck: boolean,
): { result: T } | { problem: Problem } {
  const found: string[] = [];
  // The common case, plain finite data, is returned as it is: the copying walk
  // would rebuild the whole result (and a path per element) only to return an equal one.
  const cleaned = isPlainJsonData(result) ? result : (nullNonFinite(result, [], found) as T);
  if (found.length > 0) {
    const shown = found.slice(0, 10).join(', ');
    cleaned.cautions.push({
      code: 'value_not_representable',
      message: `${found.length} value${found.length === 1 ? '' : 's'} overflowed double precision and ${found.length === 1 ? 'is' : 'are'} reported as null (${shown}${found.length > 10 ? ', …' : ''}); the data are at the edge of what 64-bit floating point holds — rescale them.`,
    });
  }
  if (!schemaCheck) return { result: cleaned };
  const checked = schema.safeParse({ ...envelope, ...cleaned });
  if (checked.success) return { result: cleaned };
  const errors = checked.error.issues.slice(0, 20).map((i) => ({ path: toPointer(i.path as (string | number)[]), message: i.message, code: 'not_representable' }));
  return {
    problem: problem(422, problemTypes.cannotCompute, 'The result cannot be represented',
      `the data drive some quantities beyond 64-bit floating point (first at ${errors[0]?.path || '(root)'}); rescale the data and send again`, { errors }),
  };
}
