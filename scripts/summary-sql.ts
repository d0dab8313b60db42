// Emits one SQL query that computes a data summary of a table in the fixed
// form of POST /v1/comparisons and /v1/searches (data.summary): rows, means
// and centred cross products of the listed columns, optionally weighted.
//   npx tsx scripts/summary-sql.ts [--postgres-json] TABLE COL1 COL2 ... [--weight W]
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

/**
 * PostgreSQL only: the same query wrapped so that it answers the request's
 * `data` object itself, {"summary": {...}}, ready to post. float8 prints
 * with round-trip precision (PostgreSQL 12 and later), so no digits are lost.
 */
export function summaryJsonSqlPostgres(table: string | string[], columns: string[], weight?: string): string {
  const p = columns.length;
  const literal = (name: string) => `'${name.replace(/'/g, "''")}'`;
  const cross = Array.from({ length: p }, (_, i) =>
    `json_build_array(${Array.from({ length: p }, (_, j) => `s.cp_${Math.min(i, j)}_${Math.max(i, j)}`).join(', ')})`);
  const weights = weight === undefined ? '' : `,\n  'weights', json_build_object('sum', s.weight_sum, 'sumLog', s.weight_sum_log)`;
  return `SELECT json_build_object('summary', json_build_object(
  'rows', s.rows,
  'columns', json_build_array(${columns.map(literal).join(', ')}),
  'means', json_build_array(${columns.map((_, i) => `s.mean_${i}`).join(', ')}),
  'centredCrossProducts', json_build_array(${cross.join(', ')})${weights}))
FROM (
${summarySql(table, columns, weight).replace(/;\s*$/, '')}
) AS s;
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
  const all = process.argv.slice(2);
  const json = all.includes('--postgres-json');
  const args = all.filter((a) => a !== '--postgres-json');
  const wi = args.indexOf('--weight');
  const weight = wi >= 0 ? args[wi + 1] : undefined;
  const rest = wi >= 0 ? [...args.slice(0, wi), ...args.slice(wi + 2)] : args;
  const [table, ...columns] = rest;
  if (!table || columns.length === 0) {
    process.stderr.write('usage: tsx scripts/summary-sql.ts [--postgres-json] TABLE COLUMN... [--weight COLUMN]\n');
    process.exit(2);
  }
  const target = table.includes('.') ? table.split('.') : table;
  process.stdout.write(json ? summaryJsonSqlPostgres(target, columns, weight) : summarySql(target, columns, weight));
}
