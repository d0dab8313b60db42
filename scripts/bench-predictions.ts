// Time of predictions with intervals, and of their model average (MATA
// bounds by Newton's method), against a comparison without predictions,
// measured in the same run; and the number of t distribution evaluations the
// averaged bounds take per bound, which the price (prediction-cost.ts) assumes.
//   npx tsx scripts/bench-predictions.ts [predictionRows=2000] [repeats=3]
// The data are the demo's (scripts/demo-data.ts) with a model of log(shrinkage) added.
import { compareModels, type ComparisonInput } from '../src/core/compare.ts';
import { DEFAULT_POLICY } from '../src/core/scoring/policy.ts';
import { demoComparison } from './demo-data.ts';
import type { Term } from '../src/core/types.ts';
import { tCdf } from '../src/core/inference/distributions.ts';
import { predictionCost, T_CDF_CELLS } from '../src/core/comparison/extras/prediction-cost.ts';

const predictionRows = Number(process.argv[2] ?? 2000);
const repeats = Number(process.argv[3] ?? 3);

const demo = demoComparison();
const candidates: ComparisonInput['candidates'] = [
  ...demo.candidates.map((c) => ({ form: 'fit' as const, name: c.name, terms: c.terms as Term[], intercept: true })),
  { form: 'fit' as const, name: 'log-curve', terms: demo.candidates[2].terms as Term[], intercept: true, response: { fn: 'log' as const } },
];
let seed = 20260303;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
const predict = {
  peakTemp: Array.from({ length: predictionRows }, () => 1150 + 100 * uniform()),
  holdMinutes: Array.from({ length: predictionRows }, () => 20 + 40 * uniform()),
  moisture: Array.from({ length: predictionRows }, () => 4 + 4 * uniform()),
  kiln: Array.from({ length: predictionRows }, () => (uniform() < 0.5 ? 'east' : 'west')),
};
const input = (withPredictions: boolean): ComparisonInput => ({
  columns: demo.data.columns, response: 'shrinkage', weights: null, candidates,
  extras: withPredictions ? { predict: { columns: predict } } : {},
  policy: DEFAULT_POLICY, policyHash: 'bench',
});

function best(f: () => void): number {
  let fastest = Infinity;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    f();
    fastest = Math.min(fastest, (performance.now() - t0) / 1000);
  }
  return fastest;
}

const run = (withPredictions: boolean) => () => {
  const out = compareModels(input(withPredictions));
  if ('issues' in out) throw new Error(JSON.stringify(out.issues.slice(0, 2)));
};
const baseline = best(run(false));
const withPredictions = best(run(true));
console.log(`demo comparison, ${candidates.length} models, ${predictionRows} prediction rows (best of ${repeats}; a busy machine's figures)`);
console.log(`comparison without predictions (baseline)   ${baseline.toFixed(3)} s   1.00x`);
console.log(`with predictions, intervals and averages    ${withPredictions.toFixed(3)} s   ${(withPredictions / baseline).toFixed(2)}x`);
console.log(`per prediction row                          ${(((withPredictions - baseline) / predictionRows) * 1e6).toFixed(1)} µs`);
const cost = predictionCost({ rows: predictionRows, columnsPerModel: [2, 3, 5, 6, 8, 5] });
console.log(`priced at ${cost.toExponential(3)} cells, ${(cost / predictionRows).toFixed(0)} per row`);

// What one t distribution function costs against one multiply-add over a
// design column (the unit of MAX_WORK_CELLS), for the price's T_CDF_CELLS.
const cells = 20_000_000;
const column = Float64Array.from({ length: 1000 }, (_, i) => i / 1000);
const multiplyAdds = best(() => {
  let s = 0;
  for (let k = 0; k < cells / 1000; k++) for (let i = 0; i < 1000; i++) s += column[i] * 1.0000001;
  if (s === 42) console.log(s);
});
const calls = 200_000;
const cdfs = best(() => {
  let s = 0;
  for (let i = 0; i < calls; i++) s += tCdf((i % 1000) / 300 - 1.5, 110);
  if (s === 42) console.log(s);
});
const perCell = multiplyAdds / cells;
console.log(`one t distribution function = ${((cdfs / calls) / perCell).toFixed(0)} multiply-adds (an evaluation per model, density and bookkeeping included, is priced at ${T_CDF_CELLS})`);
console.log(`one prediction row measured at ${(((withPredictions - baseline) / predictionRows) / perCell).toFixed(0)} multiply-adds, priced at ${(cost / predictionRows).toFixed(0)}`);
