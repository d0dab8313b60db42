// A nonlinear candidate as the request states it, checked and compiled: the
// expression parsed, its names sorted into parameters (the keys of start)
// and data columns (every other name), the start vectors and bounds read
// into arrays in parameter order. Every problem is an issue naming its path
// and, for the expression, the offset in it.
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import type { ResponseTransformSpec } from '../response-transform.ts';
import { namesUsed, parseExpression, type ParseFailure } from './expression/parse.ts';
import { FUNCTIONS, NAME_PATTERN, RESERVED_NAMES } from './expression/syntax.ts';
import { compileTape, type Tape } from './expression/tape.ts';

/** Most parameters one expression may have (the NIST problems have up to 9). */
export const MAX_PARAMETERS = 64;

export interface NonlinearCandidateSpec {
  name: string;
  expression: string;
  start?: Readonly<Record<string, number>>;
  starts?: readonly Readonly<Record<string, number>>[];
  /** Per parameter [lower, upper]; null for no bound on that side. */
  bounds?: Readonly<Record<string, readonly [number | null, number | null]>>;
  /** A response transform, applied by the caller before fitting (as for linear candidates). */
  response?: ResponseTransformSpec;
}

export interface NonlinearCandidate {
  name: string;
  expression: string;
  /** Parameter names in the order of the start object's keys. */
  parameters: string[];
  /** Data columns the expression uses, in order of first use, with that offset (code points). */
  columns: string[];
  columnOffsets: number[];
  tape: Tape;
  starts: Float64Array[];
  lower: Float64Array;
  upper: Float64Array;
  response?: ResponseTransformSpec;
}

/** Offset in Unicode code points of a UTF-16 index, as a person counts characters. */
function characterOffset(text: string, index: number): number {
  return [...text.slice(0, index)].length;
}

function parseIssue(failure: ParseFailure, text: string, at: IssuePath): Issue {
  const offset = characterOffset(text, failure.at);
  switch (failure.reason) {
    case 'syntax': return issue('expression_syntax', at, { offset, expected: failure.expected, found: failure.found });
    case 'unknown_function': return issue('expression_unknown_function', at, { offset, name: failure.name, functions: [...FUNCTIONS] });
    case 'too_long': return issue('expression_too_long', at, { length: [...text].length, limit: failure.limit });
    case 'too_deep': return issue('expression_too_deep', at, { offset, limit: failure.limit });
  }
}

/** The issue of an expression that cannot be read (syntax, function, length, depth), or null: what a request's schema can refuse before any data are read. */
export function expressionIssue(text: string, at: IssuePath): Issue | null {
  const parsed = parseExpression(text);
  return 'failure' in parsed ? parseIssue(parsed.failure, text, at) : null;
}

/** Whether an expression can use `name` as a parameter (not a function or constant of the grammar, and spellable). */
export function isParameterName(name: string): boolean {
  return !RESERVED_NAMES.has(name) && NAME_PATTERN.test(name);
}

function own(record: object, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(record, key);
}

/** The start vectors in parameter order, or issues. */
function startVectors(spec: NonlinearCandidateSpec, at: IssuePath, issues: Issue[]): { parameters: string[]; starts: Float64Array[] } | null {
  if ((spec.start === undefined) === (spec.starts === undefined) || (spec.starts && spec.starts.length === 0)) {
    issues.push(issue('start_missing', at, { given: spec.start !== undefined ? 'both' : 'neither' }));
    return null;
  }
  const vectors = spec.start !== undefined ? [spec.start] : spec.starts!;
  const path = (s: number): IssuePath => (spec.start !== undefined ? [...at, 'start'] : [...at, 'starts', s]);
  const parameters = Object.keys(vectors[0]);
  const before = issues.length;
  if (parameters.length === 0) issues.push(issue('start_missing', at, { given: 'neither' }));
  if (parameters.length > MAX_PARAMETERS) {
    issues.push(issue('parameters_too_many', path(0), { parameters: parameters.length, limit: MAX_PARAMETERS }));
  }
  for (const name of parameters) {
    if (RESERVED_NAMES.has(name)) {
      issues.push(issue('parameter_name_invalid', [...path(0), name], { parameter: name, reason: 'is a function or constant of the grammar' }));
    } else if (!NAME_PATTERN.test(name)) {
      issues.push(issue('parameter_name_invalid', [...path(0), name], {
        parameter: name, reason: 'an expression cannot spell (a letter or underscore, then letters, digits or underscores)',
      }));
    }
  }
  const starts = vectors.map((vector, s) => {
    const keys = Object.keys(vector);
    const missing = parameters.filter((p) => !own(vector, p));
    const extra = keys.filter((k) => !parameters.includes(k));
    if (missing.length > 0 || extra.length > 0) issues.push(issue('starts_parameters_differ', path(s), { missing, extra }));
    return Float64Array.from(parameters, (name) => {
      const value = own(vector, name) ? vector[name] : NaN;
      if (own(vector, name) && !(typeof value === 'number' && Number.isFinite(value))) {
        issues.push(issue('start_value_not_finite', [...path(s), name], { parameter: name }));
      }
      return value;
    });
  });
  return issues.length > before ? null : { parameters, starts };
}

/** Lower and upper bounds in parameter order (±Infinity where none), or issues. */
function boundVectors(spec: NonlinearCandidateSpec, parameters: string[], at: IssuePath, issues: Issue[]): { lower: Float64Array; upper: Float64Array } {
  const lower = new Float64Array(parameters.length).fill(-Infinity);
  const upper = new Float64Array(parameters.length).fill(Infinity);
  for (const [name, pair] of Object.entries(spec.bounds ?? {})) {
    const j = parameters.indexOf(name);
    if (j < 0) {
      issues.push(issue('bound_unknown_parameter', [...at, 'bounds', name], { parameter: name }));
      continue;
    }
    const [lo, hi] = pair;
    const l = lo === null ? -Infinity : lo;
    const u = hi === null ? Infinity : hi;
    if (!(l < u) || Number.isNaN(l) || Number.isNaN(u) || l === Infinity || u === -Infinity) {
      issues.push(issue('bound_invalid', [...at, 'bounds', name], { parameter: name, lower: lo, upper: hi }));
      continue;
    }
    lower[j] = l;
    upper[j] = u;
  }
  return { lower, upper };
}

/**
 * Checks and compiles a candidate. `hasColumn` says whether the data have a
 * column of that name; `at` is the candidate's path (e.g. ['candidates', 2]).
 */
export function prepareNonlinearCandidate(
  spec: NonlinearCandidateSpec,
  hasColumn: (name: string) => boolean,
  at: IssuePath,
): { candidate: NonlinearCandidate } | { issues: Issue[] } {
  const issues: Issue[] = [];
  const exprAt = [...at, 'expression'];
  const parsed = parseExpression(spec.expression);
  const vectors = startVectors(spec, at, issues);
  // The names of start decide how the expression reads: a parameter called
  // "exp" or "pi" makes "exp*x" unreadable, and the name is the fault to
  // report, not the syntax it breaks. So a syntax issue waits until every
  // parameter name is one an expression can spell.
  const badName = issues.some((i) => i.code === 'parameter_name_invalid');
  if ('failure' in parsed && !badName) issues.push(parseIssue(parsed.failure, spec.expression, exprAt));
  if (!vectors || 'failure' in parsed) return { issues };
  const { parameters, starts } = vectors;

  const used = namesUsed(parsed.tree);
  const columns: string[] = [];
  const columnOffsets: number[] = [];
  for (const [name, index] of [...used].sort((a, b) => a[1] - b[1])) {
    if (parameters.includes(name)) continue;
    const offset = characterOffset(spec.expression, index);
    if (!hasColumn(name)) issues.push(issue('expression_unknown_column', exprAt, { offset, column: name }));
    columns.push(name);
    columnOffsets.push(offset);
  }
  const startPath = spec.start !== undefined ? [...at, 'start'] : [...at, 'starts', 0];
  for (const name of parameters) {
    if (!used.has(name)) issues.push(issue('parameter_unused', [...startPath, name], { parameter: name }));
  }
  const { lower, upper } = boundVectors(spec, parameters, at, issues);
  starts.forEach((start, s) => {
    parameters.forEach((name, j) => {
      if (start[j] < lower[j] || start[j] > upper[j]) {
        const path = spec.start !== undefined ? [...at, 'start', name] : [...at, 'starts', s, name];
        issues.push(issue('start_outside_bounds', path, {
          parameter: name, value: start[j],
          lower: Number.isFinite(lower[j]) ? lower[j] : null,
          upper: Number.isFinite(upper[j]) ? upper[j] : null,
        }));
      }
    });
  });
  if (issues.length > 0) return { issues };
  return {
    candidate: {
      name: spec.name, expression: spec.expression, parameters, columns, columnOffsets,
      tape: compileTape(parsed.tree, parameters, columns), starts, lower, upper, response: spec.response,
    },
  };
}
