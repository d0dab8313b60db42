// A second part of the demo scenario, invented like the first
// (src/demo-scenario.ts): a soak trial in which tiles are held at a lower peak
// temperature, 1150 °C, for 0 to 45 minutes, to see how firing shrinkage
// grows with the hold. Sintering slows as the body densifies, so the data are
// drawn from a first-order approach to a plateau,
//   shrinkage (%) = 5.1 + 1.9·(1 − exp(−0.12·holdMinutes)) + N(0, 0.05²),
// and the question the worked example asks is whether that mechanistic form
// or an empirical polynomial in hold time describes them better. (By 20
// minutes nine tenths of the soak's effect has happened, which is why hold
// time does not matter in the campaign's longer holds.)
import { seededNormal, seededUniform } from './seeded-random.ts';

export function soakTrialColumns(seed = 20261202) {
  const normal = seededNormal(seededUniform(seed));
  // Three tiles at each of ten holds, 0 to 45 minutes.
  const holdMinutes = Array.from({ length: 30 }, (_, i) => 5 * Math.floor(i / 3));
  const shrinkage = holdMinutes.map((t) => Number((5.1 + 1.9 * (1 - Math.exp(-0.12 * t)) + 0.05 * normal()).toFixed(3)));
  return { holdMinutes, shrinkage };
}

/** A mechanistic model beside polynomials, ranked on one likelihood scale, with predictions averaged across both kinds. */
export function soakComparison() {
  return {
    label: 'tile shrinkage against soak time at 1150 °C (demo data)',
    data: { columns: soakTrialColumns() },
    response: 'shrinkage',
    candidates: [
      {
        name: 'approach-to-plateau',
        expression: 'base + gain*(1 - exp(-rate*holdMinutes))',
        start: { base: 5, gain: 2, rate: 0.1 },
        bounds: { rate: [0, null] },
      },
      { name: 'quadratic', terms: ['holdMinutes', { kind: 'power', of: 'holdMinutes', degree: 2 }] },
      { name: 'cubic', terms: ['holdMinutes', { kind: 'power', of: 'holdMinutes', degree: 2 }, { kind: 'power', of: 'holdMinutes', degree: 3 }] },
    ],
    options: { predict: { columns: { holdMinutes: [10, 30, 40] } } },
  };
}
