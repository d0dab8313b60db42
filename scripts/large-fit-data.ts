// Seeded random regression data for the large-fit benchmarks (a benchmark needs
// only the data's shape): m uniform columns, a linear response with noise, and
// the generator itself for anything else drawn afterwards (weights).

export function largeFitData(rows: number, m: number) {
  let seed = 20240607;
  const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  const names = Array.from({ length: m }, (_, j) => `x${j}`);
  const columns: Record<string, number[]> = {};
  for (const name of names) columns[name] = Array.from({ length: rows }, () => uniform() - 0.5);
  const y = Float64Array.from({ length: rows }, (_, i) => {
    let s = 1;
    names.forEach((name, j) => { s += ((j % 5) - 2) * 0.3 * columns[name][i]; });
    return s + 0.5 * (uniform() - 0.5);
  });
  return { names, columns, y, uniform };
}
