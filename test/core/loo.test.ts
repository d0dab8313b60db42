import t from 'tap';
import longley from '../reference/nist/longley.json' with { type: 'json' };
import norris from '../reference/nist/norris.json' with { type: 'json' };
import pontius from '../reference/nist/pontius.json' with { type: 'json' };
import { leaveOneOutError, leverages, rankByLeaveOneOut } from '../../src/core/loo.ts';
import { designWithIntercept, makeDesign, referenceFit, SOLVERS } from './inference/reference-fit.ts';
import type { DesignMatrix } from '../../src/core/types.ts';

/** PRESS by definition: refit without row i, predict row i (Allen 1974). */
function bruteForcePress(design: DesignMatrix, y: number[], w?: number[]): number {
  let press = 0;
  for (let i = 0; i < design.rows; i++) {
    const keep = (_: unknown, r: number) => r !== i;
    const reduced = makeDesign(design.labels, design.high.map((c) => Array.from(c).filter(keep)), design.intercept);
    const fit = referenceFit(reduced, y.filter(keep), w?.filter(keep));
    let prediction = 0;
    design.labels.forEach((_, j) => { prediction += design.high[j][i] * (fit.coefficients[j] ?? 0); });
    const e = y[i] - prediction;
    press += (w ? w[i] : 1) * e * e;
  }
  return press;
}

const cases: { name: string; design: DesignMatrix; y: number[]; w?: number[] }[] = [
  { name: 'NIST Norris', design: designWithIntercept({ x: norris.data.x }), y: norris.data.y },
  { name: 'NIST Pontius (quadratic)', design: designWithIntercept({ x: pontius.data.x, 'x^2': pontius.data.x.map((v) => v * v) }), y: pontius.data.y },
  {
    name: 'NIST Longley',
    design: designWithIntercept({ x1: longley.data.x1, x2: longley.data.x2, x3: longley.data.x3, x4: longley.data.x4, x5: longley.data.x5, x6: longley.data.x6 }),
    y: longley.data.y,
  },
  {
    name: 'weighted, with an aliased column',
    design: designWithIntercept({ x: [1, 2, 3, 4, 5, 6, 7, 8, 9], z: [4, 1, 3, 5, 2, 6, 3, 1, 2], sum: [5, 3, 6, 9, 7, 12, 10, 9, 11] }),
    y: [2.3, 2.1, 4.0, 5.9, 4.8, 8.1, 7.2, 6.1, 7.9],
    w: [1, 2, 0.5, 1, 1.5, 1, 3, 1, 0.25],
  },
];

t.test('PRESS from the hat matrix equals brute-force leave-one-out refits', async (t) => {
  for (const [solver, fitWith] of SOLVERS) for (const c of cases) {
    const fit = fitWith(c.design, c.y, c.w);
    const loo = leaveOneOutError(fit, c.design, c.w);
    const reference = bruteForcePress(c.design, c.y, c.w);
    const relative = Math.abs(loo.press! - reference) / reference;
    t.ok(relative < 1e-9, `${solver}, ${c.name}: press ${loo.press} vs refits ${reference} (relative ${relative.toExponential(2)})`);
    // looRmse = sqrt(press / sum w); sum w = n without weights.
    const weightTotal = c.w ? c.w.reduce((a, b) => a + b, 0) : c.design.rows;
    t.ok(Math.abs(loo.looRmse! - Math.sqrt(reference / weightTotal)) / loo.looRmse! < 1e-9);
    // Leverages sum to the rank (trace of the hat matrix; common practice).
    const trace = leverages(fit, c.design, c.w).reduce((a, b) => a + b, 0);
    t.ok(Math.abs(trace - fit.rank) < 1e-9, `${c.name}: trace ${trace} vs rank ${fit.rank}`);
  }
});

t.test('a row of leverage 1 makes PRESS undefined, with a reason', async (t) => {
  // A dummy column that is 1 on row 0 only: the fit passes through row 0 (h_00 = 1).
  const design = designWithIntercept({ x: [1, 2, 3, 4, 5, 6], onlyFirst: [1, 0, 0, 0, 0, 0] });
  const y = [5, 2.1, 2.9, 4.2, 4.8, 6.1];
  const loo = leaveOneOutError(referenceFit(design, y), design);
  t.equal(loo.press, null);
  t.equal(loo.looRmse, null);
  t.same(loo.unitLeverageRows, [0]);
  t.match(loo.reason, /leverage 1/);
});

t.test('rankings.loo orders by looRmse, smaller first, without weights', async (t) => {
  const ranking = rankByLeaveOneOut([
    { name: 'b', looRmse: 2 }, { name: 'a', looRmse: 1 }, { name: 'external', looRmse: null },
  ]);
  t.same(ranking.map((r) => [r.name, r.rank, r.delta, r.weight]), [['a', 1, 0, null], ['b', 2, 1, null], ['external', null, null, null]]);
});

t.test('looRmse is in units of the response: unchanged when relative weights are rescaled', async (t) => {
  // Relative weights carry no unit: w and 10 w give the same fit and
  // leverages, press scales by 10, and sqrt(press / sum w) does not move.
  const c = cases[3];
  const fit = referenceFit(c.design, c.y, c.w);
  const scaled = c.w!.map((w) => 10 * w);
  const a = leaveOneOutError(fit, c.design, c.w);
  const b = leaveOneOutError(referenceFit(c.design, c.y, scaled), c.design, scaled);
  t.ok(Math.abs(b.press! / a.press! - 10) < 1e-9);
  t.ok(Math.abs(b.looRmse! - a.looRmse!) / a.looRmse! < 1e-12, `${a.looRmse} vs ${b.looRmse}`);
});
