// The numerical pieces under the fits: links (inverse, complement, derivative),
// the digamma series behind the gamma shape, and the parameter estimates'
// own equations.
import t from 'tap';
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import { LINKS, LINK_NAMES } from '../../../../src/core/models/glm/index.ts';
import { gammaShape, logMinusDigamma, trigammaMinusReciprocal } from '../../../../src/core/models/glm/dispersion.ts';
import { relativeError } from './reference-data.ts';

t.test('every link: g(g⁻¹(η)) = η and dμ/dη against a central difference', async (t) => {
  const at: Record<string, number[]> = {
    identity: [-3, 0.5, 7], log: [-4, 0, 2.5], logit: [-6, -0.3, 0, 4], probit: [-3, 0.2, 2.5], cloglog: [-4, -0.5, 1.2],
    inverse: [0.2, 1.5, 4], sqrt: [0.3, 1, 5], inverseSquare: [0.2, 1, 3],
  };
  for (const name of LINK_NAMES) {
    const link = LINKS[name];
    for (const eta of at[name]) {
      t.ok(Math.abs(link.link(link.mean(eta)) - eta) <= 1e-12 * Math.max(1, Math.abs(eta)), `${name} round trip at ${eta}`);
      const h = 1e-5 * Math.max(1, Math.abs(eta));
      const numeric = (link.mean(eta + h) - link.mean(eta - h)) / (2 * h);
      t.ok(relativeError(link.derivative(eta), numeric) < 1e-8, `${name} derivative at ${eta}`);
    }
  }
});

t.test('binomial links keep 1 - μ in the tails (closed forms; common practice)', async (t) => {
  for (const name of ['logit', 'probit', 'cloglog'] as const) {
    for (const eta of [-5, -0.5, 0.5, 3]) {
      t.ok(Math.abs(LINKS[name].mean(eta) + LINKS[name].complement(eta) - 1) < 4e-16, `${name} μ + (1 - μ) = 1 at ${eta}`);
    }
  }
  // logit: 1 - μ at η = 40 is e^-40 / (1 + e^-40), far below the spacing of doubles near 1.
  t.ok(relativeError(LINKS.logit.complement(40), Math.exp(-40) / (1 + Math.exp(-40))) < 1e-15);
  t.equal(LINKS.logit.mean(40), 1, 'μ itself has rounded to 1');
  t.ok(LINKS.logit.derivative(40) > 0, 'dμ/dη stays positive there');
  // probit: Φ(-10) = 7.6198530241605260659e-24 (normal tail tables; value quoted from memory).
  t.ok(relativeError(LINKS.probit.complement(10), 7.6198530241605260659e-24) < 1e-12);
  // cloglog: 1 - μ = exp(-e^η) exactly as written; at η = 3 that is exp(-e^3).
  t.ok(relativeError(LINKS.cloglog.complement(3), Math.exp(-Math.exp(3))) < 1e-15);
});

t.test('ln ν - ψ(ν) and ψ\'(ν) - 1/ν: the asymptotic series meets @stdlib where both are accurate', async (t) => {
  for (const nu of [10, 10.5, 14, 25, 60]) {
    t.ok(relativeError(logMinusDigamma(nu), Math.log(nu) - digamma(nu)) < 1e-13, `ln ν - ψ(ν) at ${nu}`);
    t.ok(relativeError(trigammaMinusReciprocal(nu), trigamma(nu) - 1 / nu) < 1e-12, `ψ'(ν) - 1/ν at ${nu}`);
  }
  // Far out the difference is 1/(2ν) + 1/(12ν²) - … (A&S 6.3.18), where the
  // library subtraction has cancelled most digits.
  const nu = 1e7;
  t.ok(relativeError(logMinusDigamma(nu), 1 / (2 * nu) + 1 / (12 * nu * nu)) < 1e-15);
  t.ok(relativeError(trigammaMinusReciprocal(nu), 1 / (2 * nu * nu) + 1 / (6 * nu ** 3)) < 1e-15);
});

t.test('the gamma shape solves its likelihood equation n (ln ν - ψ(ν)) = D/2', async (t) => {
  for (const [deviance, n] of [[6.77, 50], [0.02, 40], [80, 30], [1e-9, 100]]) {
    const estimate = gammaShape(deviance, n)!;
    t.ok(relativeError(n * logMinusDigamma(estimate.estimate), deviance / 2) < 1e-13, `D = ${deviance}, n = ${n}: ν = ${estimate.estimate}`);
    t.ok(relativeError(estimate.standardError, 1 / Math.sqrt(n * trigammaMinusReciprocal(estimate.estimate))) < 1e-15);
  }
  t.equal(gammaShape(0, 10), null, 'an exact fit has no finite shape');
});
