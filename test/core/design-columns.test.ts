// Table shape checks, the response and the weights on the common rows.
// Expected values are worked out by hand beside each check.
import t from 'tap';
import { checkColumns, responseValues, weightValues } from '../../src/core/design/index.ts';
import type { Columns } from '../../src/core/types.ts';

t.test('checkColumns: lengths, kinds, finiteness', async (t) => {
  t.same(checkColumns({ a: [1, 2], b: ['x', null] }), []);
  t.match(checkColumns({ a: [1, 2, 3], b: [1, 2] }),
    [{ code: 'column_length_mismatch', column: 'b', length: 2, expected: 3, path: ['data', 'columns', 'b'] }]);
  t.match(checkColumns({ a: [1, 'two', 3] }), [{ code: 'column_mixed_types', column: 'a', row: 1 }]);
  t.match(checkColumns({ a: [1, Infinity] }), [{ code: 'value_not_finite', row: 1, path: ['data', 'columns', 'a', 1] }]);
});

const cols: Columns = {
  shrinkage: [6.1, 6.8, 7.9, 'n/a', 6.1],
  flat: [5, 5, 5, 5, 7],
  w: [1, 2, 0.5, 0, -1],
  wText: [1, 'heavy', 1, 1, 1],
};

t.test('responseValues', async (t) => {
  const ok = responseValues(cols, 'shrinkage', [0, 1, 2]);
  t.same('values' in ok ? [...ok.values] : null, [6.1, 6.8, 7.9]);
  t.match(responseValues(cols, 'shrinkage', [0, 3]), { issues: [{ code: 'response_not_numeric', row: 3, value: 'n/a', path: ['response'] }] });
  // flat is 5 on rows 0..3: constant there, though not over all rows.
  t.match(responseValues(cols, 'flat', [0, 1, 2, 3]), { issues: [{ code: 'response_constant', value: 5, rows: 4 }] });
  t.ok('values' in responseValues(cols, 'flat', [0, 4]));
  t.match(responseValues(cols, 'missing', [0]), { issues: [{ code: 'unknown_column', column: 'missing' }] });
});

t.test('weightValues: positive numbers, and Σ ln w', async (t) => {
  const ok = weightValues(cols, 'w', [0, 1, 2]);
  if (!('values' in ok)) throw new Error('unexpected issues');
  // ln 1 + ln 2 + ln 0.5 = 0 exactly in real arithmetic.
  t.ok(Math.abs(ok.sumLogWeights) < 1e-16);
  t.match(weightValues(cols, 'w', [0, 3]), { issues: [{ code: 'weights_not_positive', row: 3, value: 0, path: ['weights'] }] });
  t.match(weightValues(cols, 'w', [4]), { issues: [{ code: 'weights_not_positive', row: 4, value: -1 }] });
  t.match(weightValues(cols, 'wText', [0, 1]), { issues: [{ code: 'weights_not_numeric', row: 1, value: 'heavy' }] });
});
