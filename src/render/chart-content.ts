// What the chart says, before any geometry: the rows in ranking order, the
// band of each difference, and which model each criterion of the verdict prefers.
import { verdictCriteria } from './chart-options.ts';
import { criterionDisplayName } from './criteria.ts';
import { bandLegend, type BandLegend } from './band-legend.ts';
import { countAtBest, supportWording } from './delta-bands.ts';
import { modelKeys } from './model-keys.ts';
import { finiteOrNull } from './number-format.ts';
import type { CriterionName, IntegrityView, RankingEntry, StoredComparisonView } from './types.ts';

export interface ChartRow {
  name: string;
  /** The model's key (model-keys.ts), drawn beside its name. */
  key: string;
  rank: number | null;
  delta: number | null;
  weight: number | null;
  /** "best" at Δ = 0; else the support band's words: the record's own (entry.band), else ours for records without bands. */
  bandWording: string | null;
}

export interface PreferenceCell {
  criterion: CriterionName;
  criterionLabel: string;
  model: string | null;
  key: string | null;
  /** Index of the model among the distinct preferred models, the chart's own best first. */
  group: number;
}

export interface ChartContent {
  criterion: CriterionName;
  criterionLabel: string;
  rows: ChartRow[];
  bandsApply: boolean;
  /** Reference lines, shaded zones and legend wording; null for criteria without bands. */
  legend: BandLegend | null;
  weightsDefined: boolean;
  best: string | null;
  cells: PreferenceCell[];
  /** Number of distinct models the criteria prefer (1 means they agree). */
  distinctPreferred: number;
  /** Every model's key, in key order. */
  keys: Map<string, string>;
  /** The integrity check made on reading the record; null when none was made. */
  integrity: IntegrityView | null;
}

function byRank(a: RankingEntry, b: RankingEntry): number {
  const ra = finiteOrNull(a.rank);
  const rb = finiteOrNull(b.rank);
  if (ra === null && rb === null) return 0;
  if (ra === null) return 1;
  if (rb === null) return -1;
  return ra - rb;
}

/** The model a criterion prefers: the service's own verdict when it gave one, else rank 1. */
function preferredBy(record: StoredComparisonView, criterion: CriterionName): string | null {
  const stated = record.result.verdict?.best?.[criterion];
  if (typeof stated === 'string') return stated;
  const entries = [...(record.result.rankings?.[criterion] ?? [])].sort(byRank);
  const first = entries.find((e) => finiteOrNull(e.delta) !== null);
  return first?.name ?? null;
}

export function chartContent(record: StoredComparisonView, criterion: CriterionName): ChartContent {
  const legend = bandLegend(record, criterion);
  const keys = modelKeys(record);
  const keyOf = (name: string) => keys.get(name) ?? '?';
  // Array.prototype.sort is stable (ES2019), so equal ranks keep the record's order.
  const entries = [...(record.result.rankings?.[criterion] ?? [])].sort(byRank);
  const atBest = countAtBest(entries);
  const rows: ChartRow[] = entries.map((e) => {
    const delta = finiteOrNull(e.delta);
    return {
      name: String(e.name),
      key: keyOf(String(e.name)),
      rank: finiteOrNull(e.rank),
      delta,
      weight: finiteOrNull(e.weight),
      bandWording: supportWording({ band: e.band, delta }, criterion, atBest),
    };
  });
  // A model the ranking left out (no finite value) still gets its row, drawn as "no value".
  const listed = new Set(rows.map((r) => r.name));
  for (const model of record.result.models ?? []) {
    if (!listed.has(model.name)) {
      rows.push({ name: String(model.name), key: keyOf(model.name), rank: null, delta: null, weight: null, bandWording: null });
      listed.add(model.name);
    }
  }

  const best = preferredBy(record, criterion);
  const groups = new Map<string, number>();
  if (best !== null) groups.set(best, 0);
  const cells = verdictCriteria(record).map((c): PreferenceCell => {
    const model = preferredBy(record, c);
    let group = -1;
    if (model !== null) {
      if (!groups.has(model)) groups.set(model, groups.size);
      group = groups.get(model)!;
    }
    return { criterion: c, criterionLabel: criterionDisplayName(c), model, key: model === null ? null : keyOf(model), group };
  });
  const distinctPreferred = new Set(cells.map((c) => c.model).filter((m) => m !== null)).size;

  return {
    criterion,
    criterionLabel: criterionDisplayName(criterion),
    rows,
    bandsApply: legend !== null,
    legend,
    weightsDefined: rows.some((r) => r.weight !== null),
    best,
    cells,
    distinctPreferred,
    keys,
    integrity: record.integrity ?? null,
  };
}
