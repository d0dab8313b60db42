// A comparison result as an aligned terminal table: what the demo prints.
interface RankingEntry { rank: number | null; name: string; value: number | null; delta: number | null; weight: number | null; inConfidenceSet: boolean | null }
interface ModelRow { name: string; parameters: number; logLikelihood: number | null; bic: number | null; adjustedR2: number | null }
interface Result {
  id: string;
  dataset: { observations: number; rowsDropped: number; fingerprint: string };
  conventions: { rankBy: string };
  models: ModelRow[];
  rankings: Record<string, RankingEntry[]>;
  verdict: { summary: string };
  cautions: { message: string }[];
}

const fixed = (x: number | null, digits: number) => (x === null ? '—' : x.toFixed(digits));

export function formatRankingTable(result: Result): string {
  const rankBy = result.conventions.rankBy;
  const byName = new Map(result.models.map((m) => [m.name, m]));
  const header = ['rank', 'model', 'k', 'logL', rankBy, `Δ${rankBy}`, 'weight', 'in set', 'BIC', 'adj R²'];
  const rows = result.rankings[rankBy].map((entry) => {
    const m = byName.get(entry.name)!;
    return [
      entry.rank === null ? '—' : String(entry.rank), entry.name, String(m.parameters), fixed(m.logLikelihood, 3),
      fixed(entry.value, 3), fixed(entry.delta, 3), fixed(entry.weight, 4), entry.inConfidenceSet ? 'yes' : 'no',
      fixed(m.bic, 3), fixed(m.adjustedR2, 4),
    ];
  });
  const widths = header.map((h, j) => Math.max(h.length, ...rows.map((r) => r[j].length)));
  const line = (cells: string[]) =>
    cells.map((c, j) => (j === 1 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join('  ');
  const out = [
    `comparison ${result.id}`,
    `${result.dataset.observations} rows used, ${result.dataset.rowsDropped} dropped (missing values); ${result.dataset.fingerprint}`,
    '',
    line(header),
    line(widths.map((w) => '─'.repeat(w))),
    ...rows.map(line),
    '',
    result.verdict.summary,
    ...result.cautions.map((c) => `caution: ${c.message}`),
    '',
  ];
  return out.join('\n');
}
