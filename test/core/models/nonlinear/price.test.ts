// The price of a nonlinear fit is a pure function of the request's shape:
// worst case under the iteration cap, proportional to the rows and to the
// number of starts, growing with the parameters and the expression's size.
import t from 'tap';
import { priceNonlinear } from '../../../../src/core/models/nonlinear/index.ts';

const shape = { rows: 10_000, parameters: 8, tapeEntries: 40, starts: 1 };

t.test('proportional to rows and starts, growing with everything else', async (t) => {
  const base = priceNonlinear(shape);
  t.ok(base > 0 && Number.isFinite(base));
  t.equal(priceNonlinear({ ...shape, rows: 20_000 }), 2 * base, 'linear in rows');
  t.equal(priceNonlinear({ ...shape, starts: 3 }) - 3 * base, -2 * (priceNonlinear({ ...shape, starts: 0 })), 'linear in starts, plus one covariance');
  t.ok(priceNonlinear({ ...shape, parameters: 9 }) > base);
  t.ok(priceNonlinear({ ...shape, tapeEntries: 41 }) > base);
  t.ok(priceNonlinear({ ...shape, maxIterations: 100 }) < base, 'a lower cap is a lower price');
  t.equal(priceNonlinear({ ...shape, maxIterations: 1000 }), base, 'the default cap is 1000');
});

t.test('the order of magnitude a 10,000-row, 8-parameter fit costs at the default cap', async (t) => {
  // 1000 iterations x (5 n T + 4 n p + 3 n p²) ~ 1000 x 10^4 x 432 ~ 4e9, plus refinement.
  const flops = priceNonlinear(shape);
  t.ok(flops > 4e9 && flops < 6e9, `${flops.toExponential(2)} operations`);
});
