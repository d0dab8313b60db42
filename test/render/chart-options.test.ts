import t from 'tap';
import { parseChartOptions, sizePresets } from '../../src/render/chart-options.ts';
import { fixtureRecord, kilnRecord } from './fixture-record.ts';

const record = kilnRecord();

t.test('defaults: the record\'s own ranking criterion at panel size, height following the models', async (t) => {
  t.same(parseChartOptions({}, record), { ok: true, options: { criterion: 'aicc', width: sizePresets.panel.width, height: null } });
});

t.test('a size preset, overridden by an explicit width', async (t) => {
  t.same(parseChartOptions({ size: 'tile' }, record), { ok: true, options: { criterion: 'aicc', width: 420, height: 280 } });
  t.same(parseChartOptions({ size: 'tile', width: '500' }, record), { ok: true, options: { criterion: 'aicc', width: 500, height: 280 } });
  const unknown = parseChartOptions({ size: 'huge' }, record);
  t.equal(unknown.ok, false);
  if (!unknown.ok) t.match(unknown.issues, [{ path: 'size', code: 'unknown_size', received: 'huge' }]);
});

t.test('width and height: whole pixels within their ranges, edges included', async (t) => {
  t.equal(parseChartOptions({ width: '240', height: '160' }, record).ok, true);
  t.equal(parseChartOptions({ width: '2400', height: '2400' }, record).ok, true);
  for (const [key, value, code] of [
    ['width', '239', 'out_of_range'], ['width', '2401', 'out_of_range'], ['height', '159', 'out_of_range'],
    ['width', '12.5', 'not_an_integer'], ['width', '1e3', 'not_an_integer'], ['width', '-300', 'not_an_integer'],
    ['height', '', 'not_an_integer'], ['width', ' 300', 'not_an_integer'], ['width', '99999999', 'not_an_integer'],
  ] as const) {
    const result = parseChartOptions({ [key]: value }, record);
    t.equal(result.ok, false, `${key}=${JSON.stringify(value)} refused`);
    if (!result.ok) t.match(result.issues, [{ path: key, code }]);
  }
});

t.test('criterion: one of the contract\'s names, and ranked in this record', async (t) => {
  t.match(parseChartOptions({ criterion: 'bic' }, record), { ok: true, options: { criterion: 'bic' } });
  const unknown = parseChartOptions({ criterion: 'mdl' }, record);
  t.match(unknown, { ok: false, issues: [{ path: 'criterion', code: 'unknown_criterion' }] });
  // The fixture has no leave-one-out ranking: a real name, but nothing to draw.
  const absent = parseChartOptions({ criterion: 'loo' }, record);
  t.match(absent, { ok: false, issues: [{ path: 'criterion', code: 'criterion_not_ranked', ranked: ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2'] }] });
  // "__proto__" and similar must not be mistaken for a criterion or a size.
  t.match(parseChartOptions({ criterion: '__proto__', size: 'constructor' }, record), { ok: false, issues: [{ code: 'unknown_size' }, { code: 'unknown_criterion' }] });
});

t.test('unknown and repeated options are refused, every issue reported at once', async (t) => {
  const result = parseChartOptions({ colour: 'red', width: ['300', '400'], height: '10' }, record);
  t.equal(result.ok, false);
  if (!result.ok) {
    t.same(result.issues.map((i) => [i.path, i.code]), [['colour', 'unknown_option'], ['width', 'repeated_option'], ['height', 'out_of_range']]);
  }
});

t.test('a record without rankings cannot be drawn', async (t) => {
  const empty = fixtureRecord([]);
  t.match(parseChartOptions({}, empty), { ok: false, issues: [{ path: 'criterion', code: 'no_ranking' }] });
});

t.test('without a stated rankBy the first ranked criterion is used', async (t) => {
  const r = kilnRecord();
  delete r.result.verdict!.rankBy;
  delete r.result.rankings.aicc;
  t.match(parseChartOptions({}, r), { ok: true, options: { criterion: 'aic' } });
});
