// A stored search as the renderers read it. The chart of a search is the
// comparison chart of its best subsets: one ranking (the criterion the search
// ranked by) whose Δ and weights are the search's own, over every subset it
// scored, not over the listed ones only. What only a search has (term
// importance, method, budget, what was passed over) is kept beside it for the
// report. A stored result of any age is read defensively, as stored-view.ts
// reads a comparison: what is not of the expected shape is left out.
import { storedComparisonView, type StoredRecordLike } from './stored-view.ts';
import { isCriterionName } from './criteria.ts';
import { finiteOrNull } from './number-format.ts';
import type { CriterionName, IntegrityView, RankingEntry, StoredComparisonView } from './types.ts';

export interface SearchFacts {
  rankBy: CriterionName | null;
  method: string | null;
  evaluated: number | null;
  subsets: number | null;
  proven: boolean | null;
  weightsCoverAllSubsets: boolean | null;
  passedOver: [string, number][];
  budget: [string, number | null][];
  responseTransform: { fn: string; lambda?: number } | null;
  /** Per pool term: its label and its summed weight. */
  importance: { label: string; weight: number | null }[];
}

export interface StoredSearchView {
  /** The best subsets as a comparison of them, for the chart and the shared report sections. */
  ranking: StoredComparisonView;
  search: SearchFacts;
}

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

function numberEntries(value: unknown): [string, number | null][] {
  return isObject(value) ? Object.entries(value).filter(([, v]) => v === null || typeof v === 'number').map(([k, v]) => [k, finiteOrNull(v)]) : [];
}

export function storedSearchView(record: StoredRecordLike, result: Record<string, unknown>, integrity?: IntegrityView): StoredSearchView {
  const conventions = isObject(result.conventions) ? result.conventions : {};
  const rankBy = isCriterionName(conventions.rankBy) ? conventions.rankBy : null;
  const models = (Array.isArray(result.models) ? result.models : []).filter((m): m is Record<string, unknown> => isObject(m) && typeof m.name === 'string');
  let cumulative = 0;
  const entries: RankingEntry[] = models.map((m, i) => {
    const weight = finiteOrNull(m.weight);
    const delta = finiteOrNull(m.delta);
    cumulative += weight ?? 0;
    return {
      rank: i + 1,
      name: String(m.name),
      value: rankBy === null ? null : finiteOrNull(m[rankBy]),
      delta,
      weight,
      evidenceRatio: delta === null ? null : Math.exp(delta / 2),
      cumulativeWeight: weight === null ? null : cumulative,
    };
  });
  const best = entries[0]?.name;
  const asComparison = {
    ...result,
    models,
    rankings: rankBy === null ? {} : { [rankBy]: entries },
    verdict: rankBy === null || best === undefined ? undefined : { rankBy, chosen: best, best: { [rankBy]: best } },
  };
  const transform = isObject(result.responseTransform) && typeof result.responseTransform.fn === 'string'
    ? { fn: result.responseTransform.fn, ...(typeof result.responseTransform.lambda === 'number' ? { lambda: result.responseTransform.lambda } : {}) }
    : null;
  return {
    ranking: storedComparisonView(record, asComparison, integrity),
    search: {
      rankBy,
      method: typeof result.method === 'string' ? result.method : null,
      evaluated: finiteOrNull(result.evaluated),
      subsets: finiteOrNull(result.subsets),
      proven: typeof result.proven === 'boolean' ? result.proven : null,
      weightsCoverAllSubsets: typeof result.weightsCoverAllSubsets === 'boolean' ? result.weightsCoverAllSubsets : null,
      passedOver: numberEntries(result.passedOver).map(([k, v]) => [k, v ?? 0]),
      budget: numberEntries(result.budget),
      responseTransform: transform,
      importance: (Array.isArray(result.importance) ? result.importance : []).filter(isObject).map((x) => ({
        label: typeof x.label === 'string' ? x.label : JSON.stringify(x.term ?? null),
        weight: finiteOrNull(x.weight),
      })),
    },
  };
}
