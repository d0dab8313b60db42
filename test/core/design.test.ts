// Design matrices on a tiny kiln table whose columns are worked out by hand
// in the comments. Double-double reference values (hi, lo) for ln 2, √2 and
// 1/3 were computed with Python 3.11's decimal module at 60 digits:
// hi = float(v), lo = float(v - Decimal(hi)).
import t from 'tap';
import { buildDesign, columnsUsedBy, commonRows, termLabel } from '../../src/core/design/index.ts';
import type { Columns, DesignMatrix, Term } from '../../src/core/types.ts';

const table: Columns = {
  shrinkage: [6.1, 6.8, 7.9, 8.4, 9.0, 5.5],
  peakTemp: [1180, 1200, 1220, 1240, null, 1160],
  holdMinutes: [30, 45, 60, 30, 45, 60],
  moisture: [2, 4, 8, 0.5, 1, 2],
  kiln: ['east', 'west', 'east', 'west', 'east', 'west'],
  glaze: ['matte', 'gloss', 'gloss', 'matte', 'satin', 'matte'],
  notes: [null, null, null, null, null, null],
};

function design(terms: Term[], intercept = true, rows = [0, 1, 2, 3, 5]): DesignMatrix {
  const r = buildDesign(table, terms, intercept, rows, ['candidates', 0]);
  if (!('design' in r)) throw new Error(JSON.stringify(r.issues));
  return r.design;
}

function issuesOf(terms: Term[], rows = [0, 1, 2, 3, 5]) {
  const r = buildDesign(table, terms, true, rows, ['candidates', 1]);
  return 'issues' in r ? r.issues : [];
}

// Double-double carries about 104 bits: allow 2^-103 relative to the value.
const DD_TOL = 2 ** -103;

const col = (d: DesignMatrix, label: string) => [...d.high[d.labels.indexOf(label)]];
const low = (d: DesignMatrix, label: string) => [...d.low[d.labels.indexOf(label)]];

t.test('common rows: a missing value in any used column drops the row for everyone', async (t) => {
  // peakTemp is null at row 4, so rows 0..3 and 5 remain; notes is all null but unused.
  t.same(commonRows(table, ['shrinkage', 'peakTemp', 'kiln']), { rows: [0, 1, 2, 3, 5], dropped: 1 });
  t.same(commonRows(table, ['shrinkage', 'holdMinutes']), { rows: [0, 1, 2, 3, 4, 5], dropped: 0 });
  t.same(commonRows(table, ['shrinkage', 'notes']), { rows: [], dropped: 6 });
  t.same(columnsUsedBy(['peakTemp', { kind: 'product', of: ['peakTemp', 'kiln'] }, { kind: 'transform', of: 'moisture', fn: 'log' }]),
    ['peakTemp', 'kiln', 'moisture']);
});

t.test('numeric column, intercept and term mapping', async (t) => {
  const d = design(['peakTemp', 'holdMinutes']);
  t.same(d.labels, ['intercept', 'peakTemp', 'holdMinutes']);
  t.same(d.termOfColumn, [-1, 0, 1]);
  t.equal(d.rows, 5);
  t.same(col(d, 'intercept'), [1, 1, 1, 1, 1]);
  t.same(col(d, 'peakTemp'), [1180, 1200, 1220, 1240, 1160]);
  t.same(low(d, 'peakTemp'), [0, 0, 0, 0, 0]);
  const noIntercept = design(['peakTemp'], false);
  t.same(noIntercept.labels, ['peakTemp']);
  t.equal(noIntercept.intercept, false);
});

t.test('powers in double-double', async (t) => {
  const d = design([{ kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'power', of: 'holdMinutes', degree: 3 }]);
  t.same(d.labels, ['intercept', 'peakTemp^2', 'holdMinutes^3']);
  // 1180² = 1392400, 1200² = 1440000, ... all exact in double, so low = 0.
  t.same(col(d, 'peakTemp^2'), [1392400, 1440000, 1488400, 1537600, 1345600]);
  t.same(low(d, 'peakTemp^2'), [0, 0, 0, 0, 0]);
  t.same(col(d, 'holdMinutes^3'), [27000, 91125, 216000, 27000, 216000]);
  // (2^27 + 1)² = 2^54 + 2^28 + 1 needs 55 bits: hi = 2^54 + 2^28 (ties-to-even), lo = 1.
  const x = 2 ** 27 + 1;
  const r = buildDesign({ x: [x] }, [{ kind: 'power', of: 'x', degree: 2 }], false, [0]);
  if (!('design' in r)) throw new Error('unexpected issues');
  t.equal(r.design.high[0][0], 2 ** 54 + 2 ** 28);
  t.equal(r.design.low[0][0], 1);
});

t.test('products: numeric×numeric, factor×numeric, factor×factor', async (t) => {
  const d = design([
    { kind: 'product', of: ['peakTemp', 'holdMinutes'] },
    { kind: 'product', of: ['peakTemp', 'kiln'] },
    { kind: 'product', of: ['kiln', 'glaze'] },
  ]);
  // glaze on rows 0,1,2,3,5 = matte, gloss, gloss, matte, matte: levels gloss < matte
  // (satin appears only on dropped row 4); reference gloss; kiln reference east.
  t.same(d.labels, ['intercept', 'peakTemp×holdMinutes', 'peakTemp×kiln=west', 'kiln=west×glaze=matte']);
  t.same(d.termOfColumn, [-1, 0, 1, 2]);
  t.same(col(d, 'peakTemp×holdMinutes'), [35400, 54000, 73200, 37200, 69600]);
  // kiln = east, west, east, west, west
  t.same(col(d, 'peakTemp×kiln=west'), [0, 1200, 0, 1240, 1160]);
  t.same(col(d, 'kiln=west×glaze=matte'), [0, 0, 0, 1, 1]);

  // With all six rows satin is a level too: kiln=west × {glaze=matte, glaze=satin}.
  const all = design([{ kind: 'product', of: ['kiln', 'glaze'] }], true, [0, 1, 2, 3, 4, 5]);
  t.same(all.labels, ['intercept', 'kiln=west×glaze=matte', 'kiln=west×glaze=satin']);
  t.same(col(all, 'kiln=west×glaze=matte'), [0, 0, 0, 1, 0, 1]);
  t.same(col(all, 'kiln=west×glaze=satin'), [0, 0, 0, 0, 0, 0]);
});

t.test('factors: default reference, override, and its reach into products', async (t) => {
  const d = design(['kiln', 'glaze']);
  t.same(d.labels, ['intercept', 'kiln=west', 'glaze=matte']);
  t.same(col(d, 'kiln=west'), [0, 1, 0, 1, 1]);
  t.same(col(d, 'glaze=matte'), [1, 0, 0, 1, 1]);

  const o = design([{ kind: 'factor', of: 'kiln', reference: 'west' }, { kind: 'product', of: ['peakTemp', 'kiln'] }]);
  t.same(o.labels, ['intercept', 'kiln=east', 'peakTemp×kiln=east']);
  t.same(col(o, 'kiln=east'), [1, 0, 1, 0, 0]);
  t.same(col(o, 'peakTemp×kiln=east'), [1180, 0, 1220, 0, 0]);

  // A numeric column declared a factor: levels by value (30 < 45 < 60), labels as numbers.
  const h = design([{ kind: 'factor', of: 'holdMinutes' }]);
  t.same(h.labels, ['intercept', 'holdMinutes=45', 'holdMinutes=60']);
  t.same(col(h, 'holdMinutes=60'), [0, 0, 1, 0, 1]);
});

t.test('levels sort by code point, not UTF-16 code unit', async (t) => {
  // U+FF5E (fullwidth tilde) < U+1F600 by code point; as UTF-16 the emoji's
  // lead surrogate 0xD83D would sort first.
  const cols: Columns = { k: ['\u{1F600}', '\uFF5E', '\u{1F600}'] };
  const r = buildDesign(cols, ['k'], true, [0, 1, 2]);
  if (!('design' in r)) throw new Error('unexpected issues');
  t.same(r.design.labels, ['intercept', 'k=\u{1F600}']);
});

t.test('transforms in double-double, with their labels', async (t) => {
  const cols: Columns = { x: [2, 3, 1] };
  const ts: Term[] = [
    { kind: 'transform', of: 'x', fn: 'log' },
    { kind: 'transform', of: 'x', fn: 'sqrt' },
    { kind: 'transform', of: 'x', fn: 'reciprocal' },
  ];
  const r = buildDesign(cols, ts, false, [0, 1, 2]);
  if (!('design' in r)) throw new Error('unexpected issues');
  const d = r.design;
  t.same(d.labels, ['log(x)', 'sqrt(x)', '1/x']);
  // ln 2 = 0.6931471805599453 + 2.3190468138462996e-17 (decimal module, see top).
  t.equal(d.high[0][0], 0.6931471805599453);
  t.ok(Math.abs(d.low[0][0] - 2.3190468138462996e-17) < DD_TOL * 0.7);
  t.equal(d.high[0][2], 0);
  t.equal(d.low[0][2], 0);
  // √2 = 1.4142135623730951 - 9.667293313452913e-17.
  t.equal(d.high[1][0], 1.4142135623730951);
  t.ok(Math.abs(d.low[1][0] - -9.667293313452913e-17) < DD_TOL * 1.5);
  // 1/3 = 0.3333333333333333 + 1.850371707708594e-17.
  t.equal(d.high[2][1], 0.3333333333333333);
  t.ok(Math.abs(d.low[2][1] - 1.850371707708594e-17) < DD_TOL * 0.4);
});

t.test('transform domain issues name the first offending row and value', async (t) => {
  const cols: Columns = { y: [1, 2, 3, 4], x: [3, 0, -1, 2] };
  const check = (fn: 'log' | 'sqrt' | 'reciprocal') => {
    const r = buildDesign(cols, ['x', { kind: 'transform', of: 'x', fn }], true, [0, 1, 2, 3], ['candidates', 4]);
    return 'issues' in r ? r.issues : [];
  };
  t.match(check('log'), [{ code: 'transform_domain', path: ['candidates', 4, 'terms', 1], column: 'x', fn: 'log', row: 1, value: 0 }]);
  t.match(check('sqrt'), [{ code: 'transform_domain', row: 2, value: -1 }]);
  t.match(check('reciprocal'), [{ code: 'transform_domain', row: 1, value: 0 }]);
  t.match(check('log')[0].message, /candidates\/4\/terms\/1/);
  // The offending row is a position in the data: dropping row 1 moves the log issue to row 2.
  const r = buildDesign(cols, [{ kind: 'transform', of: 'x', fn: 'log' }], true, [0, 2, 3]);
  t.match('issues' in r ? r.issues : [], [{ code: 'transform_domain', row: 2, value: -1 }]);
});

t.test('terms validated against the data, with paths', async (t) => {
  t.match(issuesOf(['peakTmp']), [{ code: 'unknown_column', path: ['candidates', 1, 'terms', 0], column: 'peakTmp' }]);
  t.match(issuesOf([{ kind: 'product', of: ['peakTemp', 'klin'] }]),
    [{ code: 'unknown_column', path: ['candidates', 1, 'terms', 0, 'of', 1] }]);
  t.match(issuesOf([{ kind: 'power', of: 'kiln', degree: 2 }]), [{ code: 'term_not_numeric', column: 'kiln', form: 'power' }]);
  t.match(issuesOf([{ kind: 'transform', of: 'glaze', fn: 'sqrt' }]), [{ code: 'term_not_numeric', form: 'transform' }]);
  t.match(issuesOf([{ kind: 'power', of: 'peakTemp', degree: 1 }]), [{ code: 'power_degree_invalid', degree: 1 }]);
  t.match(issuesOf([{ kind: 'power', of: 'peakTemp', degree: 2.5 }]), [{ code: 'power_degree_invalid' }]);
  t.match(issuesOf([{ kind: 'product', of: ['peakTemp'] }]), [{ code: 'product_of_one_column', columns: ['peakTemp'] }]);
  t.match(issuesOf([{ kind: 'product', of: ['peakTemp', 'holdMinutes', 'peakTemp'] }]),
    [{ code: 'product_repeated_column', column: 'peakTemp', path: ['candidates', 1, 'terms', 0, 'of', 2] }]);
  t.match(issuesOf([{ kind: 'factor', of: 'kiln', reference: 'north' }]),
    [{ code: 'factor_level_unknown', level: 'north', levels: ['east', 'west'] }]);
  // satin is only on dropped row 4, so it is not a level of the rows used.
  t.match(issuesOf([{ kind: 'factor', of: 'glaze', reference: 'satin' }]), [{ code: 'factor_level_unknown', levels: ['gloss', 'matte'] }]);
  t.match(issuesOf(['kiln'], [0, 2, 4]), [{ code: 'factor_one_level', column: 'kiln', levels: ['east'] }]);
  t.match(issuesOf(['kiln', { kind: 'factor', of: 'kiln' }]),
    [{ code: 'duplicate_term', label: 'kiln=west', first: 0, path: ['candidates', 1, 'terms', 1] }]);
  t.match(issuesOf([{ kind: 'factor', of: 'kiln', reference: 'east' }, { kind: 'factor', of: 'kiln', reference: 'west' }]),
    [{ code: 'factor_reference_conflict', references: ['east', 'west'], path: ['candidates', 1, 'terms', 1, 'reference'] }]);
  t.match(issuesOf([{ kind: 'power', of: 'peakTemp', degree: 200 }]), [{ code: 'design_value_not_finite', label: 'peakTemp^200' }]);
  t.match(issuesOf([{ kind: 'spline', of: 'peakTemp' } as unknown as Term]), [{ code: 'term_form_unknown' }]);
  // Every bad term is reported, not just the first.
  t.equal(issuesOf(['nope', 'peakTemp', { kind: 'power', of: 'kiln', degree: 2 }]).length, 2);
  for (const i of issuesOf(['nope', { kind: 'power', of: 'kiln', degree: 2 }])) t.type(i.message, 'string');
});

t.test('termLabel describes terms in the request form', async (t) => {
  t.equal(termLabel('peakTemp'), 'peakTemp');
  t.equal(termLabel({ kind: 'power', of: 'peakTemp', degree: 2 }), 'peakTemp^2');
  t.equal(termLabel({ kind: 'product', of: ['peakTemp', 'holdMinutes'] }), 'peakTemp×holdMinutes');
  t.equal(termLabel({ kind: 'transform', of: 'moisture', fn: 'log' }), 'log(moisture)');
  t.equal(termLabel({ kind: 'transform', of: 'x', fn: 'reciprocal' }), '1/x');
  t.equal(termLabel({ kind: 'factor', of: 'kiln', reference: 'west' }), 'kiln (factor, reference west)');
});

t.test('column keys: identity from the structured term, never from the label', async (t) => {
  // A data column literally named "peakTemp^2" shares the label of the power
  // term but is a different column; its key says so.
  const data: Columns = { ...table, 'peakTemp^2': [1, 2, 3, 4, 5, 6], 'intercept': [1, 1, 1, 1, 1, 1] };
  const build = (terms: Term[], intercept = true, rows = [0, 1, 2, 3, 5]) => {
    const r = buildDesign(data, terms, intercept, rows);
    if (!('design' in r)) throw new Error(JSON.stringify(r.issues));
    return r.design;
  };
  const raw = build(['peakTemp^2']);
  const power = build([{ kind: 'power', of: 'peakTemp', degree: 2 }]);
  t.same(raw.labels, power.labels);
  t.not(raw.keys![1], power.keys![1]);
  t.not(build(['intercept'], false).keys![0], power.keys![0]);
  // One label, two codings: the dummy's key carries the reference.
  const all = [0, 1, 2, 3, 4, 5]; // row 4 holds the only "satin"
  const east = build([{ kind: 'factor', of: 'glaze', reference: 'gloss' }], true, all);
  const satin = build([{ kind: 'factor', of: 'glaze', reference: 'satin' }], true, all);
  const eastMatte = east.keys![east.labels.indexOf('glaze=matte')];
  const satinMatte = satin.keys![satin.labels.indexOf('glaze=matte')];
  t.not(eastMatte, satinMatte);
  t.same(JSON.parse(eastMatte), ['level', 'glaze', 'matte', 'gloss']);
  // a:b and b:a are one column: same key, so one candidate may not hold both.
  const ab = build([{ kind: 'product', of: ['peakTemp', 'holdMinutes'] }]);
  const ba = build([{ kind: 'product', of: ['holdMinutes', 'peakTemp'] }]);
  t.equal(ab.keys![1], ba.keys![1]);
  t.match(issuesOf([{ kind: 'product', of: ['peakTemp', 'holdMinutes'] }, { kind: 'product', of: ['holdMinutes', 'peakTemp'] }]),
    [{ code: 'duplicate_term', first: 0 }]);
  // Every design from buildDesign carries one key per column.
  t.equal(ab.keys!.length, ab.labels.length);
});
