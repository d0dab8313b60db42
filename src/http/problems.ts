// Everything that goes wrong leaves as RFC 9457 problem details. The core speaks
// in issues (codes and facts); this file alone picks status codes and words.
import type { Issue } from '../core/issues.ts';

export interface ProblemError {
  /** Where in the request, as a JSON Pointer without the leading slash ("candidates/2/terms/0"). */
  path: string;
  message: string;
  code?: string;
  [fact: string]: unknown;
}

export interface Problem {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  errors?: ProblemError[];
  [extension: string]: unknown;
}

export const PROBLEM_CONTENT_TYPE = 'application/problem+json; charset=utf-8';

/** Problem type URIs: URNs, so they identify without pretending to be a web page. */
export const problemTypes = {
  invalidJson: 'urn:parsimetry:problem:invalid-json',
  invalidRequest: 'urn:parsimetry:problem:invalid-request',
  bodyTooLarge: 'urn:parsimetry:problem:body-too-large',
  unsupportedMediaType: 'urn:parsimetry:problem:unsupported-media-type',
  cannotCompute: 'urn:parsimetry:problem:cannot-compute',
  workLimit: 'urn:parsimetry:problem:work-limit',
  notFound: 'urn:parsimetry:problem:not-found',
  methodNotAllowed: 'urn:parsimetry:problem:method-not-allowed',
  storeUnavailable: 'urn:parsimetry:problem:audit-store-unavailable',
  replayImpossible: 'urn:parsimetry:problem:replay-impossible',
  internal: 'urn:parsimetry:problem:internal',
} as const;

/** RFC 6901 escaping of one segment, so a column named "a/b" stays one segment. */
function pointerSegment(segment: string | number): string {
  return String(segment).replace(/~/g, '~0').replace(/\//g, '~1');
}

export function toPointer(path: ReadonlyArray<PropertyKey>): string {
  return path.map((s) => pointerSegment(typeof s === 'symbol' ? s.toString() : s)).join('/');
}

export function problem(status: number, type: string, title: string, detail: string, extra: Partial<Problem> = {}): Problem {
  return { type, title, status, detail, ...extra };
}

/** Core issues -> one 422 problem; each issue keeps its facts so callers can act on them. */
export function issuesProblem(issues: ReadonlyArray<Issue>): Problem {
  const errors: ProblemError[] = issues.map((issue) => {
    const { path, message, code, ...facts } = issue as Issue & Record<string, unknown>;
    return { path: toPointer(path as (string | number)[]), message: message as string, code: code as string, ...facts };
  });
  const first = errors[0];
  const detail =
    errors.length === 1
      ? first.message
      : `${errors.length} problems prevent this comparison; the first: ${first.message}`;
  // A request over one of the service's caps is not wrong, only too large: its own type, and the first cap named at the top.
  if (issues.every((i) => LIMIT_CODES.has(i.code))) {
    const { limit, setting, estimate } = issues[0] as Issue & { limit: number; setting: string; estimate?: number; columns?: number };
    const estimated = estimate ?? (issues[0] as { columns?: number }).columns;
    return problem(422, problemTypes.workLimit, 'The request is over a limit of this service', detail, { limit, setting, estimate: estimated, errors });
  }
  return problem(422, problemTypes.cannotCompute, 'The request is well-formed but cannot be computed', detail, { errors });
}

/** Issues that say a request is over a cap (src/core/pricing), not that it is wrong. */
const LIMIT_CODES: ReadonlySet<string> = new Set(['work_limit', 'memory_limit', 'result_size_limit', 'design_columns_limit']);
