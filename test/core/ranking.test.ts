// Ranking: Δ, Akaike weights, evidence ratios, confidence sets, ties.
// Facts of the trade (common practice) and a worked example by hand.
import t from 'tap';
import fc from 'fast-check';
import { akaikeWeights, rankModels } from '../../src/core/scoring/ranking.ts';

const smaller = { direction: 'smaller', weighted: true } as const;

t.test('worked example: three AIC values by hand', async (t) => {
  // AIC 100, 102, 106 → Δ = 0, 2, 6 → exp(-Δ/2) = 1, e^-1 = 0.36787944117144233,
  // e^-3 = 0.049787068367863944; sum = 1.4176665095393062;
  // weights = 1/1.41766... = 0.7053845126982412, 0.36787.../1.41766... = 0.25949646034241913,
  // 0.04978.../1.41766... = 0.03511902695933973.
  const r = rankModels([{ name: 'c', value: 106 }, { name: 'a', value: 100 }, { name: 'b', value: 102 }], smaller);
  t.same(r.map((e) => e.name), ['a', 'b', 'c']);
  t.same(r.map((e) => e.rank), [1, 2, 3]);
  t.same(r.map((e) => e.delta), [0, 2, 6]);
  const want = [0.7053845126982412, 0.25949646034241913, 0.03511902695933973];
  r.forEach((e, i) => t.ok(Math.abs(e.weight! - want[i]) < 1e-12, `weight ${e.name}`));
  // evidence ratio = exp(Δ/2): 1, e, e^3.
  t.ok(Math.abs(r[1].evidenceRatio! - Math.E) < 1e-12);
  t.ok(Math.abs(r[2].evidenceRatio! - Math.exp(3)) < 1e-10);
  // Cumulative 0.705, 0.965 (< 0.95? no: 0.9649 ≥ 0.95) → the set is {a, b}: b crosses the level.
  t.ok(Math.abs(r[1].cumulativeWeight! - 0.9648809730406603) < 1e-12);
  t.same(r.map((e) => e.inConfidenceSet), [true, true, false]);
  // At level 0.99 all three are needed; at 0.5 only the best.
  t.same(rankModels([{ name: 'a', value: 100 }, { name: 'b', value: 102 }, { name: 'c', value: 106 }], { ...smaller, confidenceLevel: 0.99 })
    .map((e) => e.inConfidenceSet), [true, true, true]);
  t.same(rankModels([{ name: 'a', value: 100 }, { name: 'b', value: 102 }, { name: 'c', value: 106 }], { ...smaller, confidenceLevel: 0.5 })
    .map((e) => e.inConfidenceSet), [true, false, false]);
});

t.test('a model at Δ = 2 has relative likelihood e^-1 against the best (common practice)', async (t) => {
  const [best, other] = rankModels([{ name: 'x', value: 10 }, { name: 'y', value: 12 }], smaller);
  t.ok(Math.abs(other.weight! / best.weight! - Math.exp(-1)) < 1e-15);
});

const valuesArb = fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 30 });

t.test('weights sum to 1 (property)', async (t) => {
  fc.assert(fc.property(valuesArb, (v) => Math.abs(akaikeWeights(v).reduce((a, b) => a + b, 0) - 1) < 1e-12));
});

t.test('Akaike weights are unchanged by adding a constant to all values (property)', async (t) => {
  fc.assert(fc.property(valuesArb, fc.double({ min: -1e6, max: 1e6, noNaN: true }), (v, c) => {
    const a = akaikeWeights(v);
    const b = akaikeWeights(v.map((x) => x + c));
    // Adding c rounds each value at ulp(1e6) ≈ 1e-10, which moves Δ and so the weights by ~1e-10.
    return a.every((w, i) => Math.abs(w - b[i]) < 1e-9);
  }));
});

t.test('values 1e6 apart do not produce NaN (stability)', async (t) => {
  const r = rankModels([{ name: 'a', value: 1e6 }, { name: 'b', value: 2e6 }, { name: 'c', value: -1e6 }], smaller);
  for (const e of r) {
    for (const k of ['delta', 'weight', 'cumulativeWeight'] as const) t.ok(Number.isFinite(e[k]), `${e.name}.${k}`);
  }
  t.same(r.map((e) => e.weight), [1, 0, 0]);
  // exp(1e6) is beyond double range: the ratio is reported as null, never Infinity.
  t.equal(r[1].evidenceRatio, null);
  t.equal(r[0].evidenceRatio, 1);
});

t.test('ties: competition ranks, name order, and the confidence set does not split a tie', async (t) => {
  const r = rankModels([
    { name: 'quad', value: 50 }, { name: 'cubic', value: 50 }, { name: 'lin', value: 58 }, { name: 'b', value: 50.5 },
  ], { ...smaller, confidenceLevel: 0.3 });
  t.same(r.map((e) => [e.name, e.rank]), [['cubic', 1], ['quad', 1], ['b', 3], ['lin', 4]]);
  // cubic alone has weight ≈ 0.36 ≥ 0.3, but quad is tied with it, so both are in the set.
  t.same(r.map((e) => e.inConfidenceSet), [true, true, false, false]);
  // Same names: input order decides.
  const same = rankModels([{ name: 'm', value: 1 }, { name: 'm', value: 1 }], smaller);
  t.same(same.map((e) => e.rank), [1, 1]);
});

t.test('larger is better (adjusted R²): Δ = best - value, no weights', async (t) => {
  const r = rankModels([{ name: 'a', value: 0.5 }, { name: 'b', value: 0.75 }, { name: 'c', value: null }],
    { direction: 'larger', weighted: false });
  t.same(r.map((e) => e.name), ['b', 'a', 'c']);
  t.same(r.map((e) => e.delta), [0, 0.25, null]);
  for (const e of r) t.same([e.weight, e.evidenceRatio, e.cumulativeWeight, e.inConfidenceSet], [null, null, null, null]);
});

t.test('null values are listed last, unranked and outside the weights', async (t) => {
  const r = rankModels([
    { name: 'z', value: null }, { name: 'a', value: 10 }, { name: 'y', value: null }, { name: 'b', value: 12 },
  ], smaller);
  t.same(r.map((e) => [e.name, e.rank]), [['a', 1], ['b', 2], ['y', null], ['z', null]]);
  t.ok(Math.abs(r[0].weight! + r[1].weight! - 1) < 1e-15);
  t.same(r[2], { rank: null, name: 'y', value: null, delta: null, weight: null, evidenceRatio: null, cumulativeWeight: null, inConfidenceSet: null });
  t.same(rankModels([], smaller), []);
  t.same(rankModels([{ name: 'only', value: null }], smaller).map((e) => e.rank), [null]);
});

t.test('delta >= 0 and 0 for the best, either direction (property)', async (t) => {
  fc.assert(fc.property(valuesArb, fc.boolean(), (v, larger) => {
    const r = rankModels(v.map((value, i) => ({ name: `m${i}`, value })), { direction: larger ? 'larger' : 'smaller', weighted: !larger });
    return r[0].delta === 0 && r.every((e) => e.delta! >= 0) && r.every((e, i) => i === 0 || e.rank! >= r[i - 1].rank!);
  }));
});
