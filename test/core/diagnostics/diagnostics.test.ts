import t from 'tap';
import reference from '../../reference/tables/diagnostics-reference.json' with { type: 'json' };
import {
  breuschPaganKoenker, cooksDistances, diagnoseFit, durbinWatson, jarqueBera, scaledConditionNumber, varianceInflationFactors,
} from '../../../src/core/diagnostics/index.ts';
import { leverages } from '../../../src/core/loo.ts';
import { fitLeastSquares } from '../../../src/core/fit/index.ts';
import { designWithIntercept, makeDesign, projectFit, referenceFit, SOLVERS } from '../inference/reference-fit.ts';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

type Case = (typeof reference.cases)['Longley'] | (typeof reference.cases)['Pontius'] | (typeof reference.cases)['Norris'];

function columnsOf(c: Case): Record<string, number[]> {
  const data = c.data as Record<string, number[]>;
  if (c.polynomialDegree) return Object.fromEntries(c.columns.map((name, k) => [name, data.x.map((v) => v ** (k + 1))]));
  return Object.fromEntries(c.columns.map((name) => [name, data[name]]));
}

// Reference values: test/reference/tables/diagnostics-reference.json, computed
// with numpy 2.4 from the published formulas (make-diagnostics-reference.py)
// on NIST StRD Longley, Pontius and Norris.
for (const [solver, fitWith] of SOLVERS) for (const [name, c] of Object.entries(reference.cases) as [string, Case][]) {
  t.test(`${name} (${solver}): checks agree with the numpy reference`, async (t) => {
    const named = columnsOf(c);
    const design = designWithIntercept(named);
    const fit = fitWith(design, c.data.y);
    const slopes = Object.values(named).map((v) => Float64Array.from(v));
    const jb = jarqueBera(fit.residuals);
    t.ok(rel(jb.statistic!, c.jarqueBera.statistic) < 1e-6, `JB ${jb.statistic} vs ${c.jarqueBera.statistic}`);
    t.ok(rel(jb.pValue!, c.jarqueBera.pValue) < 1e-6);
    t.ok(rel(jb.kurtosis!, c.jarqueBera.kurtosis) < 1e-6);
    const bp = breuschPaganKoenker(fit.residuals, slopes);
    t.equal(bp.df, c.breuschPaganKoenker.df);
    t.ok(rel(bp.statistic, c.breuschPaganKoenker.statistic) < 1e-6, `BP ${bp.statistic} vs ${c.breuschPaganKoenker.statistic}`);
    t.ok(rel(bp.pValue!, c.breuschPaganKoenker.pValue) < 1e-6);
    t.ok(rel(durbinWatson(fit.residuals), c.durbinWatson) < 1e-6);
    varianceInflationFactors(slopes).forEach((v, j) => t.ok(rel(v!, c.varianceInflationFactors[j]) < 1e-8, `VIF ${c.columns[j]} ${v}`));
    t.ok(rel(scaledConditionNumber(design.high)!, c.conditionNumber) < 1e-8);
  });
}

t.test('Longley VIFs equal 1 / (1 - R_j^2) from auxiliary regressions fitted here', async (t) => {
  // Independent computation: regress each regressor on the others with the reference fit.
  const named = columnsOf(reference.cases.Longley);
  const names = Object.keys(named);
  const vifs = varianceInflationFactors(names.map((k) => Float64Array.from(named[k])));
  names.forEach((target, j) => {
    const others = Object.fromEntries(names.filter((k) => k !== target).map((k) => [k, named[k]]));
    const aux = referenceFit(designWithIntercept(others), named[target]);
    const r2 = 1 - aux.rss / aux.tss;
    t.ok(rel(vifs[j]!, 1 / (1 - r2)) < 1e-8, `${target}: ${vifs[j]} vs ${1 / (1 - r2)}`);
  });
});

t.test('Durbin–Watson follows its definition', async (t) => {
  // d = sum (e_t - e_{t-1})^2 / sum e_t^2 (Durbin & Watson 1950), by hand.
  t.equal(durbinWatson([1, -1, 1, -1]), 12 / 4);
  t.equal(durbinWatson([1, 2, 3]), 2 / 14);
});

t.test("Cook's distance equals its definition by refits", async (t) => {
  // D_i = sum_j (yhat_j - yhat_j(i))^2 / (p s^2) (Cook 1977), refitting without row i.
  const x = [1, 2, 3, 4, 5, 6, 7, 12], y = [1.2, 1.8, 3.3, 3.9, 5.2, 5.8, 7.1, 9.5];
  const design = designWithIntercept({ x });
  const fit = referenceFit(design, y);
  const d = cooksDistances(fit.residuals, leverages(fit, design), fit.rank, fit.sigma!);
  for (let i = 0; i < x.length; i++) {
    const keep = (_: unknown, r: number) => r !== i;
    const f = referenceFit(designWithIntercept({ x: x.filter(keep) }), y.filter(keep));
    let s = 0;
    x.forEach((v, j) => { s += (fit.fitted[j] - ((f.coefficients[0] as number) + (f.coefficients[1] as number) * v)) ** 2; });
    t.ok(rel(d[i]!, s / (fit.rank * fit.sigma! ** 2)) < 1e-9, `row ${i}`);
  }
});

t.test('diagnoseFit: failed checks become plain-words cautions; thresholds are reported', async (t) => {
  // Norris: BP p = 0.0064 and DW = 1.27 in the numpy reference, so both fail.
  const c = reference.cases.Norris;
  const design = designWithIntercept(columnsOf(c));
  const fit = referenceFit(design, c.data.y);
  const d = diagnoseFit(fit, design);
  t.equal(d.available, true);
  t.equal(d.heteroscedasticity.passed, false);
  t.equal(d.autocorrelation.passed, false);
  t.equal(d.residualNormality.passed, true);
  t.match(d.autocorrelation.note, /time/);
  t.equal(d.influence.leverageThreshold, (2 * 2) / 36);
  const h = leverages(fit, design);
  t.equal(d.influence.highLeverageRows, Array.from(h).filter((v) => v > 4 / 36).length);
  // Each finding once; the reminder that checks do not validate is the comparison's, said once.
  t.equal(d.cautions.length, 2);
  t.match(d.cautions[0], /spread of the residuals/);
  t.match(d.cautions[1], /time order/);
  t.notOk(d.cautions.some((c) => /do not validate/.test(c)));
  // Longley: VIFs up to 1789 and condition number 4.3e4 fail the multicollinearity check.
  const l = reference.cases.Longley;
  const ld = designWithIntercept(columnsOf(l));
  const lDiag = diagnoseFit(projectFit(ld, l.data.y), ld);
  t.equal(lDiag.multicollinearity.passed, false);
  t.same(lDiag.multicollinearity.varianceInflationFactors.map((v) => v.term), ['x1', 'x2', 'x3', 'x4', 'x5', 'x6']);
  t.ok(lDiag.cautions.some((s) => /linear combinations/.test(s)));
});

t.test('an exact fit has no residual checks, with a reason', async (t) => {
  const x = [1, 2, 3, 4, 5];
  const design = designWithIntercept({ x });
  const d = diagnoseFit(referenceFit(design, x.map((v) => 3 + 2 * v)), design);
  t.equal(d.available, false);
  t.equal(d.residualNormality.statistic, null);
  t.match(d.reason, /exactly/);
  t.same(d.cautions, []);
});

t.test('intercept-only model: no regressors for Breusch–Pagan, no VIFs', async (t) => {
  const design = makeDesign(['intercept'], [[1, 1, 1, 1, 1, 1]], true);
  const d = diagnoseFit(referenceFit(design, [1, 3, 2, 5, 4, 6]), design);
  t.equal(d.heteroscedasticity.passed, null);
  t.same(d.multicollinearity.varianceInflationFactors, []);
  // No regressor besides the intercept: nothing can be collinear, so no centred number and no verdict.
  t.equal(d.multicollinearity.conditionNumber, null);
  t.equal(d.multicollinearity.passed, null);
  t.equal(d.multicollinearity.uncentredConditionNumber, 1);
});

t.test('equal residuals: Jarque–Bera is undefined (null, not NaN), passed null, with a note', async (t) => {
  // y = 2x + 3 on x symmetric about 0, fitted without an intercept: b = 2 and
  // every residual is 3 (worked by hand), so m2 = 0 and S, K are 0/0.
  const x = [-1, 1, -2, 2, -3, 3, -1.5, 1.5];
  const design = makeDesign(['x'], [x], false);
  const fit = referenceFit(design, x.map((v) => 2 * v + 3));
  const jb = jarqueBera(fit.residuals);
  t.same([jb.statistic, jb.pValue, jb.skewness, jb.kurtosis], [null, null, null, null]);
  const d = diagnoseFit(fit, design);
  t.equal(d.residualNormality.passed, null);
  t.match(d.residualNormality.note, /All residuals are equal/);
  t.notOk(d.cautions.some((c) => /NaN/.test(c)));
});

t.test('a design with no columns (rank 0): Cook\'s distance null, influence and collinearity not judged', async (t) => {
  // y = 0 + error: no coefficient, so no fitted value can move (D_i = 0/0).
  const y = [1.2, 1.9, 3.2, 3.8, 5.3, 5.9, 7.2, 7.7];
  const design = { rows: 8, labels: [], keys: [], high: [], low: [], intercept: false, termOfColumn: [] };
  const fit = fitLeastSquares(design, Float64Array.from(y));
  t.equal(fit.rank, 0);
  t.same(cooksDistances(fit.residuals, new Float64Array(8), 0, fit.sigma!), new Array(8).fill(null));
  const d = diagnoseFit(fit, design);
  t.equal(d.influence.maxCooksDistance, null);
  t.equal(d.influence.passed, null);
  t.equal(d.multicollinearity.conditionNumber, null);
  t.match(d.multicollinearity.note, /no coefficients/);
  // The solver's own condition number is undefined (NaN), which results report as null.
  t.ok(Number.isNaN(fit.conditionNumber));
  t.same(d.cautions.filter((c) => /carry much of the fit/.test(c)), []);
});
