// A normal lifetime candidate on an uncensored response is the Gaussian
// linear model: the same coefficients and the same full log-likelihood as
// least squares (src/core/fit) under the service's Gaussian convention
// (src/core/likelihood.ts), with σ̂² = RSS/n. The two are computed by
// different routes (Newton–Raphson on the censored-data likelihood, and
// Householder QR), so agreement to 1e-10 checks both. Data: the bearing
// endurances, the solder-joint cycles as a measurement with three terms,
// and NIST's Longley (ill-conditioned, six regressors; test/reference/nist).
import t, { type Test } from 'tap';
import { fitLeastSquares } from '../../../../src/core/fit/index.ts';
import { gaussianLogLikelihood } from '../../../../src/core/likelihood.ts';
import { fitLifetime, uncensoredResponse } from '../../../../src/core/models/lifetime/index.ts';
import type { DesignMatrix } from '../../../../src/core/types.ts';
import { loadStrd, strdDesign } from '../../../reference/nist/strd.ts';
import { bearings, design, relativeError, solderJoints, SOLDER_TERMS } from './fixtures.ts';

function compare(t: Test, label: string, X: DesignMatrix, y: Float64Array) {
  const ls = fitLeastSquares(X, y);
  const want = gaussianLogLikelihood({ n: ls.observations, rss: ls.rss })!;
  const rows = Array.from(y, (_, i) => i);
  const f = fitLifetime({ name: label, distribution: 'normal', design: X }, uncensoredResponse(y, rows, 'y'));
  if ('issues' in f) throw new Error(JSON.stringify(f.issues));
  t.ok(relativeError(f.logLikelihood, want) < 1e-10, `${label}: logLik ${f.logLikelihood} vs least squares ${want}`);
  f.coefficients.forEach((c, j) => {
    const b = ls.coefficients[j]!;
    const se = ls.standardErrors[j]!;
    // Coefficients agree to 1e-10 of their standard error (the scale on which an estimate is determined).
    t.ok(Math.abs(c.estimate! - b) <= 1e-10 * se + 1e-14 * Math.abs(b), `${label}: ${c.term} ${c.estimate} vs ${b}`);
  });
  const sd = f.distributionParameters.find((p) => p.name === 'sd')!.estimate;
  t.ok(relativeError(sd, Math.sqrt(ls.rss / ls.observations)) < 1e-10, `${label}: sd is the ML σ̂ = sqrt(RSS/n)`);
  t.equal(f.parameters, ls.rank + 1, `${label}: k = rank + 1, as for the linear model`);
}

t.test('normal on a measurement equals the intercept-only Gaussian linear model', async (t) => {
  const b = bearings();
  compare(t, 'bearings', design({ t: b }, []), Float64Array.from(b));
});

t.test('normal on a measurement with terms equals the Gaussian linear model', async (t) => {
  const columns = solderJoints();
  compare(t, 'solder joints', design(columns, SOLDER_TERMS), Float64Array.from(columns.rightOnlyCycles as number[]));
});

t.test('normal on NIST Longley (six regressors, condition number ~1e7) equals least squares', async (t) => {
  const { design: X, y } = strdDesign(loadStrd('longley'));
  compare(t, 'longley', X, y);
});
