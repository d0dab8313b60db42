// The demo scenario, invented for the demo only: a ceramics plant modelling the
// firing shrinkage of floor tiles. It lives in src/ because the OpenAPI
// document's worked examples are drawn from it (src/http/openapi-examples.ts);
// scripts/demo-data.ts re-exports it for the demo, the benchmarks and the tests. The data are generated from a known model
// with seeded noise, so the criteria have a right answer to find:
//   shrinkage (%) = 7.2 + 0.018·(peakTemp − 1200) − 0.00012·(peakTemp − 1200)²
//                   + 0.35·(moisture − 6) + 0.25·[kiln = west] + N(0, 0.15²)
// Hold time has no effect at all; a candidate that uses it is over-fitted.

import { seededNormal, seededUniform } from './seeded-random.ts';

const round = (x: number, digits: number) => Number(x.toFixed(digits));

export function demoColumns(rows = 120, seed = 20261201) {
  const uniform = seededUniform(seed);
  const normal = seededNormal(uniform);
  const shrinkage: (number | null)[] = [];
  const peakTemp: number[] = [];
  const holdMinutes: number[] = [];
  const moisture: (number | null)[] = [];
  const kiln: string[] = [];
  for (let i = 0; i < rows; i++) {
    const t = round(1150 + 100 * uniform(), 1);
    const hold = round(20 + 40 * uniform(), 0);
    const m = round(4 + 4 * uniform(), 2);
    const k = uniform() < 0.5 ? 'east' : 'west';
    const d = t - 1200;
    const y = 7.2 + 0.018 * d - 0.00012 * d * d + 0.35 * (m - 6) + (k === 'west' ? 0.25 : 0) + 0.15 * normal();
    peakTemp.push(t);
    holdMinutes.push(hold);
    kiln.push(k);
    moisture.push(m);
    shrinkage.push(round(y, 3));
  }
  // The moisture probe dropped three readings and one tile was never measured:
  // those rows are left out of every candidate alike (common rows). A shorter
  // draw keeps the gaps that fall inside it.
  for (const i of [17, 58, 91]) if (i < rows) moisture[i] = null;
  if (104 < rows) shrinkage[104] = null;
  return { shrinkage, peakTemp, holdMinutes, moisture, kiln };
}

/** The demo comparison over the first `rows` tiles (120: the demo's whole campaign). */
export function demoComparison(rows = 120) {
  return {
    label: 'tile shrinkage, spring firing campaign (demo data)',
    data: { columns: demoColumns(rows) },
    response: 'shrinkage',
    candidates: [
      { name: 'temperature', terms: ['peakTemp'] },
      { name: 'curved-temperature', terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }] },
      {
        name: 'curve+moisture+kiln',
        terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture', 'kiln'],
      },
      {
        name: 'curve+moisture+kiln+hold',
        terms: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture', 'kiln', 'holdMinutes'],
      },
      {
        name: 'everything-by-kiln',
        terms: [
          'peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture', 'kiln', 'holdMinutes',
          { kind: 'product', of: ['peakTemp', 'kiln'] }, { kind: 'product', of: ['moisture', 'kiln'] },
        ],
      },
    ],
  };
}
