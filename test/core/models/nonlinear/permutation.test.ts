// Permuting the rows changes nothing (fast-check): the least-squares problem
// is the same set of equations in another order, so estimates, standard
// errors, the sum of squares and the likelihood agree to rounding, and each
// row keeps its residual and leverage.
import t from 'tap';
import fc from 'fast-check';
import { fitPlain, fitted } from './fit-helper.ts';
import { nonlinearLeverages } from '../../../../src/core/models/nonlinear/index.ts';

// Saturating uptake of a sorbent (our own scenario): mass gained against
// relative humidity, with deterministic scatter and relative weights.
const humidity = Array.from({ length: 30 }, (_, i) => 5 + 3 * i);
const uptake = humidity.map((h, i) => (12 * h) / (35 + h) + 0.15 * Math.sin(2.7 * i));
const weights = humidity.map((_, i) => 1 + (i % 5) / 4);
const spec = { name: 'uptake', expression: 'cap*h/(half + h)', start: { cap: 10, half: 20 } };

const base = fitted(fitPlain({ spec, columns: { h: humidity }, y: uptake, weights })).fit;
const baseLeverages = nonlinearLeverages(base);
const close = (a: number, b: number, tolerance: number) => Math.abs(a - b) <= tolerance * Math.max(Math.abs(b), 1e-300);

t.test('permuting rows changes no number', async () => {
  fc.assert(fc.property(fc.shuffledSubarray(humidity.map((_, i) => i), { minLength: humidity.length }), (order) => {
    const { fit } = fitted(fitPlain({
      spec,
      columns: { h: order.map((i) => humidity[i]) },
      y: order.map((i) => uptake[i]),
      weights: order.map((i) => weights[i]),
    }));
    const h = nonlinearLeverages(fit);
    return fit.coefficients.every((c, j) =>
      close(c.estimate, base.coefficients[j].estimate, 1e-10) && close(c.standardError!, base.coefficients[j].standardError!, 1e-9))
      && close(fit.rss, base.rss, 1e-12)
      && close(fit.logLikelihood!, base.logLikelihood!, 1e-12)
      && order.every((i, k) => close(fit.residuals[k], base.residuals[i], 1e-8) && close(h[k], baseLeverages[i], 1e-9));
  }), { numRuns: 40 });
});
