// NIST Statistical Reference Datasets, nonlinear least squares (public
// domain): all 27 datasets from both NIST start vectors (54 runs) through the
// engine's public face. Required, as log relative errors (LRE, NIST /
// McCullough 1998, capped at the digits NIST prints): every certified
// estimate and the RSS to at least 6 digits, every certified standard
// deviation to at least 4. Data: test/reference/nist-nls/ (see its README).
//
// Lanczos1: the certified RSS (1.43e-25) belongs to the decimal data, and
// reading the responses as doubles moves the minimum's RSS in the fourth
// digit. Its RSS and standard deviations are therefore checked against the
// 50-digit least-squares minimum of the data as doubles
// (test/reference/nonlinear/mpmath-reference.json, mpmath), to the same 6 and
// 4 digits, and against the certified values to the 3 digits the doubles allow.
import t from 'tap';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { NLS_FILES, fitNls, loadNls, type StartKey } from '../../../reference/nist-nls/strd-nls.ts';
import { lre } from '../../../reference/nist/strd.ts';
import { gaussianLogLikelihood } from '../../../../src/core/likelihood.ts';

const ESTIMATE_DIGITS = 6;
const RSS_DIGITS = 6;
const SD_DIGITS = 4;

const mp = JSON.parse(readFileSync(fileURLToPath(new URL('../../../reference/nonlinear/mpmath-reference.json', import.meta.url)), 'utf8'));
const lanczos1 = mp.lanczos1DoubleData as { standardDeviations: string[]; residualSumOfSquares: string };

for (const file of NLS_FILES) {
  for (const start of ['start1', 'start2'] as StartKey[]) {
    t.test(`NIST StRD ${file} from ${start}`, async (t) => {
      const ds = loadNls(file);
      const result = fitNls(ds, start);
      if ('issues' in result) {
        t.fail(`no fit: ${result.issues.map((i) => i.message).join(' ')}`);
        return;
      }
      const { fit } = result;
      const cert = ds.certified;
      const p = cert.parameters.length;
      t.equal(fit.convergence.converged, true);
      t.ok(fit.convergence.iterations > 0);
      t.ok(fit.convergence.finalStep <= 1e-6, `certificate: final Gauss–Newton step ${fit.convergence.finalStep.toExponential(1)}`);
      t.equal(fit.observations, ds.observations);
      t.equal(fit.parameters, p + 1, 'k = parameters + 1');
      t.equal(fit.residualDf, cert.degreesOfFreedom);
      t.same(fit.coefficients.map((c) => c.term), ds.parameterNames, 'one coefficient per parameter, named by it');
      cert.parameters.forEach((c, j) => {
        const v = lre(fit.coefficients[j].estimate, c.estimate);
        t.ok(v >= ESTIMATE_DIGITS, `${c.name} estimate LRE ${v.toFixed(1)}`);
      });
      const exactCheck = file === 'lanczos1'
        ? { rss: lanczos1.residualSumOfSquares, sds: lanczos1.standardDeviations }
        : { rss: cert.residualSumOfSquares, sds: cert.parameters.map((c) => c.standardDeviation) };
      const rssLre = lre(fit.rss, exactCheck.rss);
      t.ok(rssLre >= RSS_DIGITS, `RSS LRE ${rssLre.toFixed(1)}`);
      exactCheck.sds.forEach((sd, j) => {
        const v = lre(fit.coefficients[j].standardError, sd);
        t.ok(v >= SD_DIGITS, `${cert.parameters[j].name} SD LRE ${v.toFixed(1)}`);
      });
      if (file === 'lanczos1') {
        t.ok(lre(fit.rss, cert.residualSumOfSquares) >= 3, 'certified RSS to the 3 digits doubles allow');
        cert.parameters.forEach((c, j) => t.ok(lre(fit.coefficients[j].standardError, c.standardDeviation) >= 3));
      }
      // The likelihood is the one convention's, from this RSS (Nelson's with its log Jacobian).
      const expected = gaussianLogLikelihood({ n: fit.observations, rss: fit.rss, jacobian: fit.responseTransform?.jacobian ?? 0 });
      t.equal(fit.logLikelihood, expected);
    });
  }
}
