// Requests small on the wire that ask for a great deal of work, in a scenario
// of our own: a coating line measuring film thickness against line speed,
// oven-zone temperatures, coil supplier lots, resin batches and operators.
// Generated from a fixed seed (the tests need shapes, not realistic values).

let seed = 4242;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const round3 = (v: number) => Math.round(v * 1000) / 1000;

export function numericColumn(rows: number, centre = 100, spread = 20): number[] {
  return Array.from({ length: rows }, () => round3(centre + spread * (uniform() - 0.5)));
}

export function textColumn(rows: number, levels: number, prefix: string): string[] {
  return Array.from({ length: rows }, (_, i) => `${prefix}${(i * 7919) % levels}`);
}

/** Oven zones z0..z(k-1) and a thickness that depends on the first few. */
export function coatingLine(rows: number, zones: number): Record<string, number[]> {
  const columns: Record<string, number[]> = { lineSpeed: numericColumn(rows, 60, 30) };
  for (let z = 0; z < zones; z++) columns[`zone${z}`] = numericColumn(rows, 180 + z, 25);
  columns.thickness = columns.lineSpeed.map((s, i) => round3(40 - 0.2 * s + 0.05 * (columns.zone0?.[i] ?? 0) - 0.03 * (columns.zone1?.[i] ?? 0) + 2 * (uniform() - 0.5)));
  return columns;
}

/** A product of three text factors of ~40 levels each: tens of thousands of design columns from a few hundred rows. */
export function wideProductOfFactors(rows = 600) {
  return {
    data: { columns: { thickness: numericColumn(rows, 30, 6), supplier: textColumn(rows, 40, 'S'), resin: textColumn(rows, 41, 'R'), operator: textColumn(rows, 39, 'O') } },
    response: 'thickness',
    candidates: [
      { name: 'speed only', terms: [] },
      { name: 'every combination', terms: [{ kind: 'product', of: ['supplier', 'resin', 'operator'] }] },
    ],
  };
}

/** One factor with hundreds of levels (coil lots) in `candidates` models. */
export function manyLevels(rows: number, levels: number, candidates: number) {
  const columns = { thickness: numericColumn(rows, 30, 6), lineSpeed: numericColumn(rows, 60, 30), lot: textColumn(rows, levels, 'lot-') };
  return {
    data: { columns },
    response: 'thickness',
    candidates: Array.from({ length: candidates }, (_, i) => ({ name: `lots ${i}`, terms: i === 0 ? ['lot'] : ['lot', 'lineSpeed', ...(i > 1 ? [{ kind: 'power', of: 'lineSpeed', degree: i }] : [])] })),
  };
}

/** A search over every subset of `pool` oven zones. */
export function zoneSearch(rows: number, pool: number, extra: Record<string, unknown> = {}) {
  return {
    data: { columns: coatingLine(rows, pool) },
    response: 'thickness',
    pool: Array.from({ length: pool }, (_, z) => `zone${z}`),
    top: 5,
    ...extra,
  };
}

/** A data summary of `columns` oven zones and the thickness, as a warehouse would send it (centred cross products of generated rows). */
export function zoneSummary(columns: number, rows = 300) {
  const data = coatingLine(rows, columns);
  const names = [...Array.from({ length: columns }, (_, z) => `zone${z}`), 'thickness'];
  const values = names.map((n) => data[n]);
  const means = values.map((v) => v.reduce((a, b) => a + b, 0) / rows);
  const centredCrossProducts = values.map((a, i) => values.map((b, j) => a.reduce((s, x, r) => s + (x - means[i]) * (b[r] - means[j]), 0)));
  return { rows, columns: names, means, centredCrossProducts };
}

/** Twenty models asked to predict at a hundred thousand new rows: a ~400 KB body, a ~250 MB answer. */
export function manyPredictions(models = 20, newRows = 100_000) {
  const columns = coatingLine(200, 2);
  return {
    data: { columns },
    response: 'thickness',
    candidates: Array.from({ length: models }, (_, i) => ({ name: `model ${i}`, terms: i % 2 ? ['lineSpeed'] : ['lineSpeed', 'zone0'] })),
    options: { predict: { columns: { lineSpeed: Array.from({ length: newRows }, (_, i) => 40 + (i % 40)), zone0: Array.from({ length: newRows }, () => 181) } } },
  };
}

/** Polls until `ready()` holds (a state of the service, not a duration). */
export async function until(ready: () => boolean | Promise<boolean>, what: string, timeoutMs = 240_000): Promise<void> {
  const started = Date.now();
  while (!(await ready())) {
    if (Date.now() - started > timeoutMs) throw new Error(`still waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}
