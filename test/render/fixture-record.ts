// Stored comparison records for the renderer tests. The numbers are invented
// (the tile-shrinkage scenario of the demo) and only feed the pictures: the
// criteria are derived from each model's RSS and parameter count with the
// formulas of the public contract (api.md, "Conventions"), so a record is
// internally consistent, but no test here checks statistics.
import { DEFAULT_POLICY, deltaBand, type Policy } from '../../src/core/scoring/policy.ts';
import type { CriterionName, ModelView, RankingEntry, StoredComparisonView } from '../../src/render/types.ts';

/** Words for each entry's Δ, as a stored result carries them (entry.band); absent for records older than bands. */
export type FixtureBands = { policy: Policy } | undefined;

export interface FixtureModel {
  name: string;
  rss: number;
  /** k: coefficients plus one for the error variance. */
  parameters: number;
  terms?: string[];
}

function gaussianLogLikelihood(n: number, rss: number): number {
  return (-n / 2) * (Math.log(2 * Math.PI) + Math.log(rss / n) + 1);
}

function rank(models: ModelView[], criterion: CriterionName, value: (m: ModelView) => number | null, largerIsBetter = false): RankingEntry[] {
  const scored = models
    .map((m) => ({ name: m.name, value: value(m) }))
    .filter((s): s is { name: string; value: number } => s.value !== null);
  scored.sort((a, b) => (largerIsBetter ? b.value - a.value : a.value - b.value));
  if (scored.length === 0) return [];
  const best = scored[0].value;
  const deltas = scored.map((s) => (largerIsBetter ? best - s.value : s.value - best));
  const raw = deltas.map((d) => Math.exp(-d / 2));
  const total = raw.reduce((a, b) => a + b, 0);
  let cumulative = 0;
  return scored.map((s, i) => {
    const weight = largerIsBetter ? null : raw[i] / total;
    const before = cumulative;
    cumulative += weight ?? 0;
    return {
      rank: i + 1,
      name: s.name,
      value: s.value,
      delta: deltas[i],
      weight,
      evidenceRatio: largerIsBetter ? null : Math.exp(deltas[i] / 2),
      cumulativeWeight: largerIsBetter ? null : cumulative,
      inConfidenceSet: largerIsBetter ? null : before < 0.95,
    };
  });
}

/**
 * bands: label each entry with the policy's words for its Δ, by the policy's own
 * function (src/core/scoring/policy.ts deltaBand), as the service does since results
 * carry bands; adjusted R² gets null, as in the contract.
 */
export function fixtureRecord(models: FixtureModel[], options: { n?: number; tss?: number; label?: string; id?: string; bands?: FixtureBands } = {}): StoredComparisonView {
  const n = options.n ?? 40;
  const tss = options.tss ?? 12.5;
  const views: ModelView[] = models.map((m) => {
    const k = m.parameters;
    const p = k - 1;
    const logLikelihood = gaussianLogLikelihood(n, m.rss);
    const aic = -2 * logLikelihood + 2 * k;
    const r2 = 1 - m.rss / tss;
    const terms = m.terms ?? ['peakTemp'];
    return {
      name: m.name,
      source: 'fit',
      parameters: k,
      observations: n,
      logLikelihood,
      aic,
      aicc: n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null,
      bic: -2 * logLikelihood + k * Math.log(n),
      hqc: -2 * logLikelihood + 2 * k * Math.log(Math.log(n)),
      rss: m.rss,
      r2,
      adjustedR2: 1 - ((1 - r2) * (n - 1)) / (n - p),
      sigma: Math.sqrt(m.rss / (n - p)),
      coefficients: [{ term: 'intercept', estimate: -14.2, standardError: 1.9 }, ...terms.map((term, i) => ({ term, estimate: 0.0123 / (i + 1), standardError: 0.0021 }))],
      aliased: [],
      cautions: [],
    };
  });
  const rankings = {
    aicc: rank(views, 'aicc', (m) => m.aicc),
    aic: rank(views, 'aic', (m) => m.aic),
    bic: rank(views, 'bic', (m) => m.bic),
    hqc: rank(views, 'hqc', (m) => m.hqc ?? null),
    adjustedR2: rank(views, 'adjustedR2', (m) => m.adjustedR2, true),
  };
  const bands = options.bands;
  if (bands) {
    for (const [criterion, entries] of Object.entries(rankings) as [CriterionName, RankingEntry[]][]) {
      for (const e of entries) e.band = criterion === 'adjustedR2' ? null : deltaBand(e.delta, criterion as Parameters<typeof deltaBand>[1], bands.policy);
    }
  }
  const best = Object.fromEntries(Object.entries(rankings).map(([c, entries]) => [c, entries[0]?.name ?? null]));
  const agree = new Set(Object.values(best)).size === 1;
  const id = options.id ?? 'cmp_0001';
  return {
    id,
    createdAt: '2026-03-02T09:15:00.000Z',
    label: options.label,
    seq: 17,
    hash: 'b'.repeat(64),
    prevHash: 'a'.repeat(64),
    result: {
      id,
      createdAt: '2026-03-02T09:15:00.000Z',
      conventions: { version: '1', parameterCount: 'coefficients plus error variance', logLikelihood: 'full Gaussian, constants included' },
      dataset: { fingerprint: 'sha256:' + 'c'.repeat(64), observations: n, rowsDropped: 2, response: 'shrinkage' },
      models: views,
      rankings,
      verdict: { agree, best, rankBy: 'aicc', summary: agree ? `All criteria prefer ${best.aicc}.` : 'The criteria prefer different models.' },
      cautions: [],
      ...(bands ? { policy: { name: bands.policy.name, hash: 'sha256:' + 'd'.repeat(64) } } : {}),
    },
  };
}

export const defaultPolicyBands: FixtureBands = { policy: DEFAULT_POLICY };

/** Five tile-shrinkage candidates on which BIC and adjusted R² part company with AICc. */
export function kilnRecord(label = 'kiln trial, March', bands?: FixtureBands): StoredComparisonView {
  return fixtureRecord(
    [
      { name: 'linear', rss: 4.1, parameters: 3, terms: ['peakTemp'] },
      { name: 'quadratic', rss: 3.55, parameters: 4, terms: ['peakTemp', 'peakTemp^2'] },
      { name: 'by-kiln', rss: 3.2, parameters: 6, terms: ['peakTemp', 'kiln=west', 'peakTemp×kiln=west', 'holdMinutes'] },
      { name: 'with-moisture', rss: 3.05, parameters: 8, terms: ['peakTemp', 'moisture', 'holdMinutes', 'kiln=west', 'peakTemp^2', 'moisture×kiln=west'] },
      { name: 'hold-only', rss: 9.8, parameters: 3, terms: ['holdMinutes'] },
    ],
    { label, bands },
  );
}
