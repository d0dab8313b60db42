import t from 'tap';
import { bandsApply, supportBandOf } from '../../src/render/delta-bands.ts';

// Burnham & Anderson (2002), Model Selection and Multimodel Inference, 2nd ed.,
// section 2.6 (from memory): Δ ≤ 2 substantial support, 4–7 considerably less,
// > 10 essentially none; 2–4 and 7–10 are not covered by the rule.
t.test('bands follow the published edges', async (t) => {
  const cases: [number, string][] = [
    [0, 'close'], [1.99, 'close'], [2, 'close'],
    [2.01, 'gap-low'], [3.99, 'gap-low'],
    [4, 'weaker'], [5.5, 'weaker'], [7, 'weaker'],
    [7.01, 'gap-high'], [10, 'gap-high'],
    [10.01, 'negligible'], [1e6, 'negligible'],
  ];
  for (const [delta, band] of cases) t.equal(supportBandOf(delta)?.band, band, `Δ = ${delta}`);
});

t.test('no band for a missing or impossible difference', async (t) => {
  for (const delta of [null, Number.NaN, Number.POSITIVE_INFINITY, -0.5]) t.equal(supportBandOf(delta), null, String(delta));
});

t.test('the gaps are named neutrally, the bands in plain words', async (t) => {
  t.equal(supportBandOf(3)?.wording, 'between bands');
  t.equal(supportBandOf(8)?.wording, 'between bands');
  t.not(supportBandOf(1)?.wording, supportBandOf(12)?.wording);
});

t.test('bands are for criteria on the -2 log-likelihood scale only', async (t) => {
  t.same(['aicc', 'aic', 'bic', 'hqc', 'adjustedR2', 'loo'].map((c) => bandsApply(c as never)), [true, true, true, true, false, false]);
});
