import t from 'tap';
import { DEFAULT_POLICY, deltaBand } from '../../src/core/scoring/policy.ts';
import { bandFamily, bandOf, bandsApply, entryBandWording, ownBands, referenceLines, supportBandOf } from '../../src/render/delta-bands.ts';

// Burnham & Anderson (2002), Model Selection and Multimodel Inference, 2nd ed.,
// section 2.6 (from memory): Δ ≤ 2 substantial support, 4–7 considerably less,
// > 10 essentially none; 2–4 and 7–10 are not covered by the rule.
t.test('AIC-type bands follow the published edges', async (t) => {
  const cases: [number, string][] = [
    [0, 'close'], [1.99, 'close'], [2, 'close'],
    [2.01, 'gap-low'], [3.99, 'gap-low'],
    [4, 'weaker'], [5.5, 'weaker'], [7, 'weaker'],
    [7.01, 'gap-high'], [10, 'gap-high'],
    [10.01, 'negligible'], [1e6, 'negligible'],
  ];
  for (const [delta, band] of cases) t.equal(supportBandOf(delta)?.band, band, `Δ = ${delta}`);
});

// Kass & Raftery (1995), "Bayes factors", JASA 90 (from memory), on the 2 ln B
// scale: 0–2 not worth more than a bare mention, 2–6 positive, 6–10 strong, > 10 very strong.
t.test('BIC bands follow Kass & Raftery\'s edges', async (t) => {
  const cases: [number, string][] = [[0, 'close'], [2, 'close'], [2.5, 'positive'], [6, 'positive'], [6.5, 'strong'], [10, 'strong'], [10.5, 'very-strong']];
  for (const [delta, band] of cases) t.equal(bandOf(delta, ownBands.bic)?.band, band, `ΔBIC = ${delta}`);
});

t.test('no band for a missing or impossible difference', async (t) => {
  for (const delta of [null, Number.NaN, Number.POSITIVE_INFINITY, -0.5]) t.equal(supportBandOf(delta), null, String(delta));
});

t.test('the gaps are named neutrally, the bands in plain words', async (t) => {
  t.equal(supportBandOf(3)?.wording, 'between bands');
  t.equal(supportBandOf(8)?.wording, 'between bands');
  t.not(supportBandOf(1)?.wording, supportBandOf(12)?.wording);
});

t.test('bands are for criteria on the -2 log-likelihood scale only; BIC has its own', async (t) => {
  t.same(['aicc', 'aic', 'bic', 'hqc', 'adjustedR2', 'loo'].map((c) => bandsApply(c as never)), [true, true, true, true, false, false]);
  t.same(['aicc', 'aic', 'bic', 'hqc'].map((c) => bandFamily(c as never)), ['akaike', 'akaike', 'bic', 'akaike'], 'as the policy: akaikeBands for AIC, AICc, HQC');
});

// The service's own policy is the reference for what the JSON says: the lines
// and our fallback bands must have exactly its edges, for both families.
t.test('reference lines and our band edges are the default policy\'s', async (t) => {
  t.same(referenceLines.akaike, DEFAULT_POLICY.akaikeBands.map((b) => b.maxDelta).filter((d) => d !== null));
  t.same(referenceLines.bic, DEFAULT_POLICY.bicBands.map((b) => b.maxDelta).filter((d) => d !== null));
  t.same(ownBands.akaike.map((b) => [b.maxDelta, b.includeMax]), DEFAULT_POLICY.akaikeBands.map((b) => [b.maxDelta, b.includeMax]));
  t.same(ownBands.bic.map((b) => [b.maxDelta, b.includeMax]), DEFAULT_POLICY.bicBands.map((b) => [b.maxDelta, b.includeMax]));
  // Same edges means the same band for every Δ, edges included.
  const grid = [0, 1, 2, 2 + 1e-9, 3, 4 - 1e-9, 4, 5, 6, 6 + 1e-9, 7, 7 + 1e-9, 8, 10, 10 + 1e-9, 50];
  for (const [family, criterion, policyBands] of [['akaike', 'aicc', DEFAULT_POLICY.akaikeBands], ['bic', 'bic', DEFAULT_POLICY.bicBands]] as const) {
    for (const delta of grid) {
      const ours = ownBands[family].indexOf(bandOf(delta, ownBands[family])!);
      const theirs = policyBands.findIndex((b) => b.wording === deltaBand(delta, criterion, DEFAULT_POLICY));
      t.equal(ours, theirs, `${family} Δ = ${delta}: same band`);
    }
  }
});

t.test('an entry\'s own band wins; null means none; absent falls back to ours', async (t) => {
  t.equal(entryBandWording({ band: 'substantial support', delta: 9 }, 'aicc'), 'substantial support', 'the record\'s words, whatever Δ');
  t.equal(entryBandWording({ band: null, delta: 1 }, 'aicc'), null, 'the record says there is none');
  t.equal(entryBandWording({ delta: 1 }, 'aicc'), 'about as good as the best', 'older record: our reading');
  t.equal(entryBandWording({ delta: 8 }, 'bic'), 'strong evidence against it', 'older record, BIC: our BIC reading');
  t.equal(entryBandWording({ delta: 0.1 }, 'adjustedR2'), null, 'no bands for adjusted R²');
});
