// Time of the after-ranking statistics of one fitted model (leave-one-out
// error, assumption checks, predictions) against the fit's own time,
// measured in the same run: the checks should cost well under the fit.
//   npx tsx scripts/bench-after-ranking.ts [rows=100000] [columns=30] [weighted=0]
// The data are random from a seeded generator (a benchmark needs only their shape).
import { buildDesign } from '../src/core/design/index.ts';
import { fitLeastSquares } from '../src/core/fit/index.ts';
import { leaveOneOutError } from '../src/core/loo.ts';
import { diagnoseFit } from '../src/core/diagnostics/index.ts';
import { predictMeanResponse } from '../src/core/predict.ts';
import { modelGeometry } from '../src/core/inference/model-geometry.ts';
import type { Columns } from '../src/core/types.ts';
import { largeFitData } from './large-fit-data.ts';

const rows = Number(process.argv[2] ?? 100_000);
const m = Number(process.argv[3] ?? 30);
const weighted = process.argv[4] === '1';

const { names, columns, y, uniform } = largeFitData(rows, m);
const weights = weighted ? Float64Array.from({ length: rows }, () => 0.5 + uniform()) : undefined;
const allRows = Array.from({ length: rows }, (_, i) => i);

const time = <T>(f: () => T): [T, number] => {
  const t0 = performance.now();
  const r = f();
  return [r, (performance.now() - t0) / 1000];
};

const [built, designSeconds] = time(() => buildDesign(columns as Columns, names, true, allRows));
if ('issues' in built) throw new Error(JSON.stringify(built.issues.slice(0, 3)));
const design = built.design;
const [fit, fitSeconds] = time(() => fitLeastSquares(design, y, weights));
const [, geometrySeconds] = time(() => modelGeometry(fit, design, weights));
const [loo, looSeconds] = time(() => leaveOneOutError(fit, design, weights));
const [diag, diagnoseSeconds] = time(() => diagnoseFit(fit, design, weights));
// As the comparison calls them: one geometry shared by both.
const [, sharedSeconds] = time(() => {
  const geometry = modelGeometry(fit, design, weights);
  leaveOneOutError(fit, design, weights, geometry);
  diagnoseFit(fit, design, weights, geometry);
});
const newRows = { rows: 1000, labels: design.labels, high: design.high.map((c) => c.slice(0, 1000)), low: design.low.map((c) => c.slice(0, 1000)), intercept: true, termOfColumn: design.termOfColumn };
const [, predictSeconds] = time(() => predictMeanResponse(fit, design, newRows, weights));

const line = (step: string, seconds: number) =>
  console.log(`${step.padEnd(38)} ${seconds.toFixed(3).padStart(8)} s   ${(seconds / fitSeconds).toFixed(3).padStart(7)} x fit`);
console.log(`n = ${rows}, p = ${design.labels.length}${weighted ? ', weighted' : ''}`);
line('buildDesign', designSeconds);
line('fitLeastSquares (baseline)', fitSeconds);
line('modelGeometry (shared basis)', geometrySeconds);
line('leaveOneOutError (own geometry)', looSeconds);
line('diagnoseFit (own geometry)', diagnoseSeconds);
line('geometry + LOO + diagnostics, shared', sharedSeconds);
line('predictMeanResponse, 1000 rows', predictSeconds);
console.log(`press ${loo.press}, max VIF ${diag.multicollinearity.maxVarianceInflation}, condition ${diag.multicollinearity.conditionNumber}, BP ${diag.heteroscedasticity.statistic}`);
