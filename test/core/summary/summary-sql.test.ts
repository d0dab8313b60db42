// The SQL generator: the shape of its query, and — against a real
// PostgreSQL when PARSIMETRY_TEST_PG_URL is set (required when CI=true) —
// that its result equals summariseRows on the same rows.

import t from 'tap';
import { summaryFromRow, summarySql } from '../../../scripts/summary-sql.ts';
import { summariseRows } from '../../../src/core/summary/index.ts';
import { demoColumns } from '../../../scripts/demo-data.ts';

t.test('query shape', (t) => {
  const sql = summarySql('tiles', ['peakTemp', 'shrinkage']);
  t.match(sql, /WITH kept AS/);
  t.match(sql, /"peakTemp" IS NOT NULL AND "shrinkage" IS NOT NULL/);
  t.match(sql, /AVG\(CAST\("peakTemp" AS DOUBLE PRECISION\)\) AS m0/);
  t.equal((sql.match(/AS cp_\d+_\d+/g) ?? []).length, 3, 'p(p+1)/2 cross products');
  t.notMatch(sql, /SUM\(CAST\("peakTemp" AS DOUBLE PRECISION\) \* CAST/, 'no raw sums of products');
  t.match(summarySql(['plant', 'odd"name'], ['x'], 'w'), /"plant"\."odd""name"/, 'identifiers quoted');
  t.match(summarySql('t', ['x'], 'w'), /SUM\(LN\(CAST\("w" AS DOUBLE PRECISION\)\)\) AS weight_sum_log/);
  t.end();
});

const url = process.env.PARSIMETRY_TEST_PG_URL;
t.test('on PostgreSQL, equals summariseRows', { skip: !url && process.env.CI !== 'true' ? 'PARSIMETRY_TEST_PG_URL not set' : false }, async (t) => {
  if (!url) return t.fail('CI=true needs PARSIMETRY_TEST_PG_URL');
  const { default: pg } = await import('pg');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const d = demoColumns();
    await client.query('CREATE TEMP TABLE tiles ("peakTemp" double precision, "moisture" double precision, "shrinkage" double precision, "w" double precision)');
    for (let i = 0; i < d.peakTemp.length; i++) {
      await client.query('INSERT INTO tiles VALUES ($1, $2, $3, $4)', [d.peakTemp[i], d.moisture[i], d.shrinkage[i], 1 + (i % 3)]);
    }
    const names = ['peakTemp', 'moisture', 'shrinkage'];
    const keep = d.peakTemp.map((_, i) => d.moisture[i] !== null && d.shrinkage[i] !== null);
    const col = (v: (number | null)[]) => Float64Array.from(v.filter((_, i) => keep[i]) as number[]);
    const cols = [col(d.peakTemp), col(d.moisture), col(d.shrinkage)];
    const w = Float64Array.from(d.peakTemp.map((_, i) => 1 + (i % 3)).filter((_, i) => keep[i]));
    for (const weighted of [false, true]) {
      const res = await client.query(summarySql('tiles', names, weighted ? 'w' : undefined));
      const got = summaryFromRow(res.rows[0], names, weighted);
      const want = summariseRows(cols, weighted ? w : null, names);
      t.equal(got.rows, want.rows);
      t.ok(got.means.every((m, j) => Math.abs(m - want.means[j]) <= 1e-12 * Math.abs(want.means[j])), 'means');
      const C = want.centredCrossProducts;
      t.ok(got.centredCrossProducts.every((r, i) => r.every((v, j) => Math.abs(v - C[i][j]) <= 1e-10 * Math.sqrt(C[i][i] * C[j][j]))), 'cross products');
    }
  } finally {
    await client.end();
  }
});
