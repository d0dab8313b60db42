// The integrity check made when the record was read for this page, at the
// top of the page where no reader can miss it: a failure in a bordered alert
// before anything else, an intact record in one quiet line. The page is
// cached while the record is intact (src/http/routes/pictures.ts), so the
// line says when the check was made: when this page was made.
import { tag, type Html } from './html-markup.ts';
import type { StoredComparisonView } from './types.ts';

export function integrityNotice(record: StoredComparisonView): Html | null {
  const integrity = record.integrity;
  if (integrity === null || integrity === undefined) return null;
  if (!integrity.ok) {
    return tag('div', { class: 'integrity failed', role: 'alert', 'data-integrity': 'failed' },
      tag('strong', {}, `This record fails its integrity check (${integrity.reason ?? 'unknown'}).`),
      ' ',
      integrity.detail,
      ' The numbers below are what the database holds now, not necessarily what the service answered.');
  }
  return tag('p', { class: 'integrity ok', 'data-integrity': 'ok' }, tag('strong', {}, 'Integrity checked when this page was made: '), integrity.detail);
}

/** The chain section's line for the same check. */
export function integrityFact(record: StoredComparisonView): [string, string] | null {
  const integrity = record.integrity;
  if (integrity === null || integrity === undefined) return null;
  return ['integrity', integrity.ok ? 'intact when this page was made' : `FAILED (${integrity.reason ?? 'unknown'}) when this page was made`];
}
