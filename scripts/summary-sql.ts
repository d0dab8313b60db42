// Emits one SQL query that computes a data summary of a table in the fixed
// form of POST /v1/comparisons and /v1/searches (data.summary): rows, means
// and centred cross products of the listed columns, optionally weighted.
//   npx tsx scripts/summary-sql.ts TABLE COL1 COL2 ... [--weight W]
// Means are formed first in a CTE, then sums of products of deviations
// from them. The one-pass SUM(x*y) - n*AVG(x)*AVG(y) form is not used: with
// means large against spreads (a kiln temperature of ~1200 °C varying by a
// few degrees) it subtracts two nearly equal numbers and loses most digits,
// while deviations from the mean keep them (Chan, Golub & LeVeque 1983).
// Rows with a NULL in any listed column are left out (common rows). Plain
// ANSI SQL with double precision; runs on PostgreSQL and most engines.
// The result is one row: rows, then mean_<i>, then cp_<i>_<j> for i <= j.

import { pathToFileURL } from 'node:url';

export function quoteIdentifier(name: string): string {
  return `"${name.replace(/"/g, '""')}"`;
}

/** `table` may be schema-qualified as ["schema", "table"]. */
export function summarySql(table: string | string[], columns: string[], weight?: string): string {
  if (columns.length === 0) throw new Error('at least one column');
  const from = (Array.isArray(table) ? table : [table]).map(quoteIdentifier).join('.');
  const q = columns.map(quoteIdentifier);
  const w = weight === undefined ? null : quoteIdentifier(weight);
  const used = [...q, ...(w ? [w] : [])];
  const notNull = used.map((c) => `${c} IS NOT NULL`).join(' AND ');
  const val = (i: number) => `CAST(${q[i]} AS DOUBLE PRECISION)`;
  const weightExpr = w ? `CAST(${w} AS DOUBLE PRECISION)` : null;
  const means = columns
    .map((_, i) => (weightExpr ? `SUM(${weightExpr} * ${val(i)}) / SUM(${weightExpr}) AS m${i}` : `AVG(${val(i)}) AS m${i}`))
    .join(',\n    ');
  const sums: string[] = [];
  for (let i = 0; i < columns.length; i++) {
    for (let j = i; j < columns.length; j++) {
      const product = `(${val(i)} - m.m${i}) * (${val(j)} - m.m${j})`;
      sums.push(`SUM(${weightExpr ? `${weightExpr} * ` : ''}${product}) AS cp_${i}_${j}`);
    }
  }
  const weightCols = weightExpr ? `,\n  SUM(${weightExpr}) AS weight_sum,\n  SUM(LN(${weightExpr})) AS weight_sum_log` : '';
  return `WITH kept AS (
  SELECT * FROM ${from} WHERE ${notNull}
), m AS (
  SELECT
    ${means}
  FROM kept
)
SELECT
  COUNT(*) AS rows${weightCols},
  ${columns.map((_, i) => `MAX(m.m${i}) AS mean_${i}`).join(',\n  ')},
  ${sums.join(',\n  ')}
FROM kept CROSS JOIN m;
`;
}

/** The fixed summary form from the query's one result row. */
export function summaryFromRow(row: Record<string, unknown>, columns: string[], weighted: boolean) {
  const num = (k: string) => Number(row[k]);
  const p = columns.length;
  const cross = Array.from({ length: p }, (_, i) => Array.from({ length: p }, (_, j) => num(`cp_${Math.min(i, j)}_${Math.max(i, j)}`)));
  return {
    rows: num('rows'),
    columns: [...columns],
    means: columns.map((_, i) => num(`mean_${i}`)),
    centredCrossProducts: cross,
    ...(weighted ? { weights: { sum: num('weight_sum'), sumLog: num('weight_sum_log') } } : {}),
  };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const args = process.argv.slice(2);
  const wi = args.indexOf('--weight');
  const weight = wi >= 0 ? args[wi + 1] : undefined;
  const rest = wi >= 0 ? [...args.slice(0, wi), ...args.slice(wi + 2)] : args;
  const [table, ...columns] = rest;
  if (!table || columns.length === 0) {
    process.stderr.write('usage: tsx scripts/summary-sql.ts TABLE COLUMN... [--weight COLUMN]\n');
    process.exit(2);
  }
  process.stdout.write(summarySql(table.includes('.') ? table.split('.') : table, columns, weight));
}
