// How much of a long list the report prints. A record may hold 100,000
// averaged predictions or thousands of coefficients per model; the page shows
// the first rows of each such table, says how many it left out and where the
// rest are, so its size (and the memory to build it) stays bounded whatever
// the record holds. The chart draws one row per model and needs no bound here
// (a comparison has at most 200 candidates).
import { tag, type Html } from './html-markup.ts';
import { formatCount } from './number-format.ts';

export const REPORT_ROW_LIMITS = {
  coefficients: 200,
  averagedTerms: 200,
  averagedPredictions: 50,
  aliasedNames: 200,
} as const;

export function firstRows<T>(rows: readonly T[], limit: number): { shown: T[]; total: number } {
  return { shown: rows.slice(0, limit), total: rows.length };
}

/** "Showing the first 50 of 100,000 …": null when nothing was left out. */
export function leftOutNote(shown: number, total: number, what: string, recordId: string, under = '/v1/comparisons'): Html | null {
  if (total <= shown) return null;
  return tag('p', { class: 'note', 'data-left-out': String(total - shown) },
    `Showing the first ${formatCount(shown)} of ${formatCount(total)} ${what}; the stored record (GET ${under}/${recordId}) holds them all.`);
}
