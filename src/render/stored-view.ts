// From a record as the audit store hands it back to what the renderers read.
// The store keeps every record in the shape its service version answered, so
// the result is checked only as far as the renderers walk it: lists that are
// not lists become empty and elements that are not objects are left out, so a
// record of any age draws without a crash.
import type { ComparisonResultView, IntegrityView, ModelView, RankingEntry, StoredComparisonView } from './types.ts';

/** The envelope fields of a stored record (src/audit/store.ts StoredRecord has them all). */
export interface StoredRecordLike {
  id: string;
  createdAt: string;
  label: string | null;
  seq: number;
  prevHash: string;
  hash: string;
}

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
const objects = <T>(v: unknown): T[] => (Array.isArray(v) ? v.filter(isObject) : []) as T[];

/**
 * `result` is the result as the service answered it (with its id and createdAt);
 * `integrity` the check made as it was read (absent: not checked, and the
 * pictures say nothing about it).
 */
export function storedComparisonView(record: StoredRecordLike, result: Record<string, unknown>, integrity?: IntegrityView): StoredComparisonView {
  const rankings = isObject(result.rankings) ? result.rankings : {};
  const view: ComparisonResultView = {
    ...(result as Partial<ComparisonResultView>),
    id: String(result.id ?? record.id),
    models: objects<ModelView>(result.models)
      .filter((m) => typeof m.name === 'string')
      .map((m) => ({
        ...m,
        coefficients: objects<NonNullable<ModelView['coefficients']>[number]>(m.coefficients),
        aliased: Array.isArray(m.aliased) ? m.aliased.map(String) : [],
        cautions: Array.isArray(m.cautions) ? m.cautions : [],
      })),
    rankings: Object.fromEntries(
      Object.entries(rankings).map(([criterion, entries]) => [criterion, objects<RankingEntry>(entries).filter((e) => typeof e.name === 'string')]),
    ),
    verdict: isObject(result.verdict) ? (result.verdict as ComparisonResultView['verdict']) : undefined,
    dataset: isObject(result.dataset) ? (result.dataset as ComparisonResultView['dataset']) : undefined,
    conventions: isObject(result.conventions) ? result.conventions : undefined,
    policy: isObject(result.policy) ? (result.policy as ComparisonResultView['policy']) : undefined,
    cautions: Array.isArray(result.cautions) ? (result.cautions as ComparisonResultView['cautions']) : undefined,
    nestedTests: Array.isArray(result.nestedTests) ? objects(result.nestedTests) : undefined,
    averaged: isObject(result.averaged) ? (result.averaged as ComparisonResultView['averaged']) : undefined,
  };
  return { id: record.id, createdAt: record.createdAt, label: record.label, seq: record.seq, hash: record.hash, prevHash: record.prevHash, result: view, integrity: integrity ?? null };
}
