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

export const zodValidatorCompiler: FastifySchemaCompiler<z.ZodType> = ({ schema, httpPart }) => (data) => {
  const result = schema.safeParse(data);
  if (result.success) return { value: result.data };
  const issues = result.error.issues.slice(0, MAX_ISSUES).map((i) => ({
    path: i.path as PropertyKey[],
    message: i.message,
    code: i.code,
  }));
  return { error: new RequestValidationError(httpPart ?? 'request', issues) };
};
