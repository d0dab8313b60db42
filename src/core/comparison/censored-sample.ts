// The response with its censoring, read once for the whole comparison, and
// the rule that keeps censored rows honest: only a candidate whose
// likelihood models censoring may be scored on them. A least-squares fit (or
// any model that reads each response value as observed) would take a
// censoring time for a failure time.
import { issue, type Issue } from '../issues.ts';
import type { Columns } from '../types.ts';
import type { CandidateInput, CandidateForm } from '../models/registry.ts';
import type { ScoringContext } from '../models/scoring-context.ts';
import {
  censoredResponse, censoringCounts, isCensored, uncensoredResponse, type CensoredResponse, type CensoringColumns,
} from '../models/lifetime/index.ts';

/**
 * Forms whose likelihood can hold censored rows: a life distribution, and a
 * log-likelihood the caller computed (e.g. a survival model fitted elsewhere).
 * Every other form, including kinds added later, is refused on censored data.
 */
/** The refused forms in words (a kind added later is named by its form). */
const FORM_WORDS: Partial<Record<CandidateForm, string>> = {
  fit: 'least squares fitted here',
  residuals: 'residuals of a least-squares fit',
  rss: 'the RSS of a least-squares fit',
};

const READS_CENSORING: ReadonlySet<CandidateForm> = new Set<CandidateForm>(['lifetime', 'logLikelihood']);

export interface CensoredSampleInput {
  columns: Columns | null;
  response: string | null;
  weights: string | null;
  censoring: CensoringColumns | null;
  candidates: readonly CandidateInput[];
}

/** Columns that decide the common rows besides the terms': the status (never the upper, null off interval rows). */
export function censoringRowColumns(censoring: CensoringColumns | null): string[] {
  return censoring ? [censoring.status] : [];
}

/**
 * The censored response on the comparison's rows when any candidate is a
 * lifetime one or censoring was sent; null when neither. Issues go to `issues`.
 */
export function censoredSample(input: CensoredSampleInput, ctx: ScoringContext, issues: Issue[]): CensoredResponse | null {
  const lifetime = input.candidates.flatMap((c, i) => (c.form === 'lifetime' ? [{ name: c.name, i }] : []));
  if (!input.censoring && lifetime.length === 0) return null;
  if (!input.columns || input.response === null || !ctx.rows || !ctx.y) {
    if (input.censoring) issues.push(issue('data_required', ['censoring'], { form: 'censoring' }));
    return null;
  }
  if (input.weights && lifetime.length > 0) {
    issues.push(issue('lifetime_weights_not_supported', ['weights'], { candidates: lifetime.map((c) => c.name) }));
  }
  if (!input.censoring) return uncensoredResponse(ctx.y, ctx.rows, input.response);
  const read = censoredResponse(input.columns, input.response, input.censoring, ctx.rows);
  if ('issues' in read) {
    issues.push(...read.issues);
    return null;
  }
  if (isCensored(read.response)) {
    const counts = censoringCounts(read.response);
    const censored = read.response.time.length - counts.exact;
    input.candidates.forEach((c, i) => {
      if (!READS_CENSORING.has(c.form)) {
        issues.push(issue('censored_response_refused', ['candidates', i], { name: c.name, form: FORM_WORDS[c.form] ?? c.form, censored, rows: read.response.time.length }));
      }
    });
  }
  return read.response;
}
