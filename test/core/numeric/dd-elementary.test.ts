// Double-double elementary functions against 50-digit values from mpmath
// (test/reference/nonlinear/mpmath-reference.json, made by
// scripts/nonlinear-mpmath-fixtures.py). Required: relative error below
// 1e-30 (double-double carries ~32 digits; 2^-100 is 7.9e-31).
import t from 'tap';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { DD_PI, ddAtanDD, ddExpDD, ddLog10DD, ddLogDD, ddPowDD, ddSinCos, ddTanDD } from '../../../src/core/numeric/dd-elementary.ts';
import { ddExp, type DD } from '../../../src/core/numeric/double-double.ts';

const reference = JSON.parse(readFileSync(fileURLToPath(new URL('../../reference/nonlinear/mpmath-reference.json', import.meta.url)), 'utf8'));

function relativeError(got: DD, want: DD): number {
  // (got - want) in double-double, divided by |want|.
  const dh = got[0] - want[0];
  const dl = got[1] - want[1];
  return Math.abs(dh + dl) / Math.abs(want[0]);
}

const FUNCTIONS: Record<string, (a: DD, b?: DD) => DD> = {
  exp: (a) => ddExpDD(a[0], a[1]),
  log: (a) => ddLogDD(a[0], a[1]),
  log10: (a) => ddLog10DD(a[0], a[1]),
  sin: (a) => ddSinCos(a[0], a[1]).sin,
  cos: (a) => ddSinCos(a[0], a[1]).cos,
  tan: (a) => ddTanDD(a[0], a[1]),
  atan: (a) => ddAtanDD(a[0], a[1]),
  pow: (a, b) => ddPowDD(a[0], a[1], b![0], b![1]),
};

for (const point of reference.elementary as { fn: string; argument: DD | [DD, DD]; value: DD }[]) {
  const args = point.fn === 'pow' ? (point.argument as [DD, DD]) : [point.argument as DD];
  const got = FUNCTIONS[point.fn](args[0], args[1]);
  const error = relativeError(got, point.value);
  t.ok(error < 1e-30, `${point.fn}(${JSON.stringify(point.argument)}) relative error ${error.toExponential(2)} (mpmath)`);
}

t.same(DD_PI, reference.constants.pi, 'pi split as mpmath splits it');

t.test('table-driven exp agrees with the series-and-squaring exp across its range', async (t) => {
  // ddExp (double-double.ts) is itself checked against 60-digit values; the
  // two methods share no code past the double-double arithmetic. Near the
  // ends of the range the difference is ddExp's own (ln2 in two parts: up to
  // ~6e-31 there; ddExpDD keeps a third part, see the mpmath points above).
  // A seeded linear congruential generator (Numerical Recipes' constants)
  // picks the points.
  let state = 2026;
  const uniform = () => {
    state = (1664525 * state + 1013904223) % 2 ** 32;
    return state / 2 ** 32;
  };
  let worst = 0;
  for (let i = 0; i < 2000; i++) {
    const h = -700 + 1400 * uniform();
    const l = (uniform() - 0.5) * Math.abs(h) * 2e-16;
    worst = Math.max(worst, relativeError(ddExpDD(h, l), ddExp(h, l)));
  }
  t.ok(worst < 1e-30, `largest relative difference over 2000 points in [-700, 700]: ${worst.toExponential(2)}`);
  t.same(ddExpDD(710, 0), [Infinity, 0]);
  t.same(ddExpDD(-746, 0), [0, 0]);
  t.ok(Number.isNaN(ddExpDD(NaN, 0)[0]));
});

t.test('edge cases follow Math', async (t) => {
  t.same(ddLogDD(0, 0), [-Infinity, 0]);
  t.ok(Number.isNaN(ddLogDD(-1, 0)[0]));
  t.ok(Math.abs(ddLogDD(5e-324, 0)[0] - Math.log(5e-324)) < 1e-13, 'subnormal argument: scaled, not overflowed');
  t.ok(Math.abs(ddLogDD(1.7e308, 0)[0] - Math.log(1.7e308)) < 1e-13);
  t.same(ddPowDD(0, 0, 2.5, 0), [0, 0]);
  t.same(ddPowDD(0, 0, -1, 0), [Infinity, 0]);
  t.same(ddPowDD(-2, 0, 3, 0), [-8, 0], 'integer exponent of a negative base');
  t.ok(Number.isNaN(ddPowDD(-2, 0, 0.5, 0)[0]));
  t.equal(ddSinCos(1e300, 0).sin[0], Math.sin(1e300), 'beyond 2^50 radians the double function is used');
  t.equal(ddAtanDD(Infinity, 0)[0], Math.PI / 2);
});
