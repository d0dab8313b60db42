// The special functions under the lifetime likelihoods against mpmath at
// 40-50 digits (test/reference/lifetime/*-mpmath.json, made by
// scripts/lifetime-reference.py) and against closed forms.
import t from 'tap';
import gammainc from '@stdlib/math-base-special-gammainc';
import { incompleteGammaTails } from '../../../../src/core/models/lifetime/incomplete-gamma.ts';
import { normalHazardExcess, normalLogSurvival } from '../../../../src/core/models/lifetime/normal-tail.ts';
import { logisticLaw, normalLaw, smallestExtremeValueLaw } from '../../../../src/core/models/lifetime/standard-families.ts';
import { logIntervalProbability } from '../../../../src/core/models/lifetime/location-scale-likelihood.ts';
import { gammaIntervalProbability } from '../../../../src/core/models/lifetime/gamma-likelihood.ts';
import { percentileAt } from '../../../../src/core/models/lifetime/life-quantities.ts';
import { readReference, relativeError } from './fixtures.ts';

t.test('incomplete gamma tails and their shape derivatives equal mpmath', async (t) => {
  const ref = readReference('incomplete-gamma-mpmath.json');
  for (const row of ref.rows) {
    const got = incompleteGammaTails(row.shape, row.x);
    for (const tail of ['lower', 'upper'] as const) {
      const want = row[tail];
      const at = `${tail} κ=${row.shape} x=${row.x}`;
      // ln X to 1e-13 absolute (the prefactor κ ln x - x - lnΓ(κ) loses about κε at large κ: 1e-12 at κ = 1000).
      t.ok(Math.abs(got[tail].log - want.log) <= (row.shape >= 200 ? 1e-11 : 1e-13) * Math.max(1, Math.abs(want.log)), `${at}: ln ${got[tail].log} vs ${want.log}`);
      const scale = Math.max(1, Math.abs(want.d1));
      t.ok(Math.abs(got[tail].d1 - want.d1) <= 1e-10 * scale, `${at}: X_κ/X ${got[tail].d1} vs ${want.d1}`);
      t.ok(Math.abs(got[tail].d2 - want.d2) <= 1e-9 * Math.max(1, Math.abs(want.d2)), `${at}: X_κκ/X ${got[tail].d2} vs ${want.d2}`);
    }
  }
});

t.test('incomplete gamma agrees with @stdlib gammainc where that is accurate', async (t) => {
  for (const [k, x] of [[0.5, 0.2], [3, 2], [3, 9], [12, 20]]) {
    const got = incompleteGammaTails(k, x);
    t.ok(relativeError(Math.exp(got.lower.log), gammainc(x, k)) < 1e-13);
    t.ok(relativeError(Math.exp(got.upper.log), gammainc(x, k, true, true)) < 1e-13);
  }
});

t.test('normal upper tail and hazard excess equal mpmath far into both tails', async (t) => {
  const ref = readReference('normal-tail-mpmath.json');
  for (const row of ref.rows) {
    t.ok(relativeError(normalLogSurvival(row.z), row.logSurvival) < 1e-13 || Math.abs(normalLogSurvival(row.z) - row.logSurvival) < 1e-16,
      `ln S(${row.z}) ${normalLogSurvival(row.z)} vs ${row.logSurvival}`);
    t.ok(relativeError(normalHazardExcess(row.z), row.hazardExcess) < 1e-10, `λ(${row.z}) - z ${normalHazardExcess(row.z)} vs ${row.hazardExcess}`);
  }
});

t.test('smallest extreme value and logistic in closed form, both tails', async (t) => {
  // SEV: ln S = -e^z; ln F = ln(1 - exp(-e^z)) → z for z ≪ 0 (closed forms, by hand).
  t.equal(smallestExtremeValueLaw.logSurvival(2), -Math.exp(2));
  t.ok(Math.abs(smallestExtremeValueLaw.logDistribution(-800) - -800) < 1e-12, 'ln F(-800) = -800 without underflow');
  t.ok(relativeError(smallestExtremeValueLaw.logDistribution(0.5), Math.log(1 - Math.exp(-Math.exp(0.5)))) < 1e-15);
  // Logistic: ln S = -ln(1 + e^z); at z = 800 it is -800 (no overflow).
  t.ok(Math.abs(logisticLaw.logSurvival(800) - -800) < 1e-12);
  t.ok(relativeError(logisticLaw.logDistribution(-1.5), -Math.log1p(Math.exp(1.5))) < 1e-15);
});

t.test('quantiles invert the distribution functions', async (t) => {
  for (const law of [smallestExtremeValueLaw, normalLaw, logisticLaw]) {
    for (const p of [1e-12, 0.001, 0.1, 0.5, 0.9, 0.999]) {
      const z = law.quantile(p);
      t.ok(relativeError(Math.exp(law.logDistribution(z)), p) < 1e-12, `F(z_${p}) = ${p}`);
    }
  }
});

t.test('interval probabilities keep their digits in either tail', async (t) => {
  // Both ends far in the upper tail: F(hi) - F(lo) would be 1 - 1 = 0 in
  // doubles; on the survival side it is S(lo) - S(hi). SEV closed form:
  // S(z) = exp(-e^z), so ln D = -e^{zlo} + ln(1 - exp(e^{zlo} - e^{zhi})) (by hand).
  const zlo = 3.2, zhi = 3.3;
  const want = -Math.exp(zlo) + Math.log(-Math.expm1(Math.exp(zlo) - Math.exp(zhi)));
  t.ok(relativeError(logIntervalProbability(smallestExtremeValueLaw, zlo, zhi), want) < 1e-14);
  // Normal, both ends at z ≈ 40: mpmath gives S(40) = 3.655893540915e-350; the
  // interval (40, 40.5) holds S(40) - S(40.5): ln ≈ -803.28… and finite.
  const far = logIntervalProbability(normalLaw, 40, 40.5);
  t.ok(Number.isFinite(far) && far < -800 && far > -810, `ln P(40 < Z <= 40.5) = ${far}`);
  // Gamma: both ends in the upper tail at shape 2, P(60 < X <= 61) ≈ Q(2, 60) - Q(2, 61); closed form Q(2, x) = (1 + x) e^{-x}.
  const q = (x: number) => Math.log1p(x) - x;
  const g = gammaIntervalProbability(2, 60, 61);
  t.ok(relativeError(g.log, q(60) + Math.log(-Math.expm1(q(61) - q(60)))) < 1e-13, `gamma ln D ${g.log}`);
});

t.test('gamma percentiles equal scipy.special.gammaincinv, large shapes included', async (t) => {
  // percentileAt at μ = 0 (scale 1) and no uncertainty gives the standard gamma quantile x_p.
  const ref = readReference('incomplete-gamma-mpmath.json');
  for (const q of ref.quantiles) {
    const estimates = { distribution: 'gamma' as const, estimable: [0], coefficients: Float64Array.of(0), extra: Math.log(q.shape), covariance: new Float64Array(4), dimension: 2 };
    const got = percentileAt(estimates, [1], q.p, 1.96).estimate;
    t.ok(relativeError(got, q.x) < 1e-12, `x_${q.p} at shape ${q.shape}: ${got} vs ${q.x}`);
  }
});
