// A refusal from the service as an Error: the RFC 9457 problem details it sent (status, type,
// title, detail, errors with JSON-pointer-like paths), or, when the answer was not problem+json
// (a proxy's page, say), a problem made from the status and the first of the body.
import type { ComparisonList, Problem } from './types.js';

export class ParsimetryError extends Error {
  readonly status: number;
  readonly problem: Problem;

  constructor(problem: Problem) {
    const where = problem.errors?.length ? ` (${problem.errors.map((e) => `${e.path || '(request)'}: ${e.message}`).join('; ')})` : '';
    super(`${problem.status} ${problem.title}: ${problem.detail}${where}`);
    this.name = 'ParsimetryError';
    this.status = problem.status;
    this.problem = problem;
  }

  get type(): string { return this.problem.type; }
  get title(): string { return this.problem.title; }
  get detail(): string { return this.problem.detail; }
  get errors(): NonNullable<Problem['errors']> { return this.problem.errors ?? []; }
}

const isProblem = (value: unknown): value is Problem =>
  typeof value === 'object' && value !== null &&
  typeof (value as Problem).status === 'number' && typeof (value as Problem).title === 'string' && typeof (value as Problem).type === 'string';

const withDetail = (p: Problem): Problem => ({ ...p, detail: typeof p.detail === 'string' ? p.detail : '' });

/** The error for a refused answer; reads its body. */
export async function refusal(response: Response): Promise<ParsimetryError> {
  const text = await response.text();
  try {
    const body: unknown = JSON.parse(text);
    if (isProblem(body)) return new ParsimetryError(withDetail(body));
  } catch {
    // not JSON: described below from the status
  }
  return new ParsimetryError({
    type: 'about:blank',
    title: response.statusText || `HTTP ${response.status}`,
    status: response.status,
    detail: text.slice(0, 500) || 'the service answered without a body',
  });
}

/** A problem that arrived as a stream's closing `problem` event. */
export function streamedProblem(data: unknown): ParsimetryError {
  if (isProblem(data)) return new ParsimetryError(withDetail(data));
  return new ParsimetryError({ type: 'about:blank', title: 'Malformed problem event', status: 502, detail: JSON.stringify(data).slice(0, 500) });
}

/** A listing page held rows that no longer read back as records: the audit store is damaged. */
export class UnreadableRecordsError extends Error {
  constructor(readonly rows: ComparisonList['unreadable']) {
    super(`the listing holds ${rows.length} row(s) that no longer read back as records (chain positions ${rows.map((r) => r.seq).join(', ')}); run GET /v1/audit/verify`);
    this.name = 'UnreadableRecordsError';
  }
}
