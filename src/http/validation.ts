// zod as fastify's validator, keeping zod's own issue paths: the type provider's
// default flattens them to "/a/b" strings, which cannot be turned back into exact
// JSON Pointers when a column name contains "/".
import type { FastifySchemaCompiler } from 'fastify';
import type { z } from 'zod';

export interface ValidationIssue {
  path: PropertyKey[];
  message: string;
  code: string;
}

export class RequestValidationError extends Error {
  readonly statusCode = 400;
  constructor(readonly part: string, readonly issues: ValidationIssue[]) {
    super(`invalid ${part}`);
  }

  summary(): string {
    const first = this.issues[0];
    const where = first.path.length ? `${first.path.join('.')}: ` : '';
    const more = this.issues.length > 1 ? ` (and ${this.issues.length - 1} more)` : '';
    return `${where}${first.message}${more}`;
  }
}

// zod reports every element of a long column; a caller needs the first few.
const MAX_ISSUES = 50;

type ZodIssue = z.core.$ZodIssue;

// A branch failed "structurally" when the value is not of its shape at all
// (wrong type at its root, a required key missing, keys it does not know), as
// opposed to having the shape with a bad value inside. A key the value does
// have, holding the wrong type ({ "family": 7 }), is a bad value of the form
// the caller meant, not a sign of another form: its message names the field.
function structuralFailures(branch: ZodIssue[], value: unknown): number {
  const has = (key: PropertyKey) => value !== null && typeof value === 'object' && !Array.isArray(value) && Object.hasOwn(value, key);
  return branch.filter((i) => i.code === 'unrecognized_keys'
    || (i.code === 'invalid_type' && (i.path.length === 0 || (i.path.length === 1 && !has(i.path[0]))))).length;
}

/** The value at a zod path inside the parsed data (undefined where there is none). */
function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value = root;
  for (const key of path) {
    if (value === null || typeof value !== 'object' || !Object.hasOwn(value, key)) return undefined;
    value = (value as Record<PropertyKey, unknown>)[key];
  }
  return value;
}

/**
 * zod reports a failed union as one "Invalid input" with every branch's issues.
 * A caller needs the issues of the form they evidently meant: the branch that
 * fits the value's shape best (fewest structural failures, then fewest issues).
 */
function expand(issue: ZodIssue, prefix: PropertyKey[], root: unknown): ValidationIssue[] {
  const path = [...prefix, ...(issue.path as PropertyKey[])];
  if (issue.code === 'invalid_union' && issue.errors.length > 0) {
    const value = valueAt(root, path);
    const ranked = [...issue.errors].sort(
      (a, b) => structuralFailures(a, value) - structuralFailures(b, value) || a.length - b.length,
    );
    const best = ranked[0];
    if (structuralFailures(best, value) === 0) return best.flatMap((i) => expand(i, path, root));
    // A union with its own message (the candidate forms, a data value) says it better than any one branch.
    if (issue.message !== 'Invalid input') return [{ path, message: issue.message, code: issue.code }];
    const hint = best.find((i) => i.code === 'invalid_type' || i.code === 'unrecognized_keys') ?? best[0];
    const where = hint.path.length ? ` (nearest form: ${hint.path.join('.')}: ${hint.message})` : ` (nearest form: ${hint.message})`;
    return [{ path, message: `${issue.message === 'Invalid input' ? 'matches none of the accepted forms' : issue.message}${where}`, code: issue.code }];
  }
  return [{ path, message: issue.message, code: issue.code }];
}

export const zodValidatorCompiler: FastifySchemaCompiler<z.ZodType> = ({ schema, httpPart }) => (data) => {
  const result = schema.safeParse(data);
  if (result.success) return { value: result.data };
  const issues = result.error.issues.flatMap((i) => expand(i, [], data)).slice(0, MAX_ISSUES);
  return { error: new RequestValidationError(httpPart ?? 'request', issues) };
};
