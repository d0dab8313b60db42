// A model linear in its parameters, written as an expression, must give the
// linear engine's numbers: estimates, standard errors, RSS and log-likelihood
// to 1e-10 (relative), with weights and with a response transform, and its
// linearised leverages must be the linear hat matrix's. An identity of least
// squares (common practice): Levenberg–Marquardt on a linear model converges
// to the least-squares solution, and J is the design.
import t, { type Test } from 'tap';
import { fitPlain, fitted } from './fit-helper.ts';
import { buildDesign, responseValues, weightValues } from '../../../../src/core/design/index.ts';
import { fitCandidate } from '../../../../src/core/models/linear/fitted-model.ts';
import { transformResponse } from '../../../../src/core/models/response-transform.ts';
import { leverages as linearLeverages } from '../../../../src/core/loo.ts';
import { nonlinearLeverages, nonlinearLeaveOneOut } from '../../../../src/core/models/nonlinear/index.ts';
import { leaveOneOutError } from '../../../../src/core/loo.ts';
import { loadStrd } from '../../../reference/nist/strd.ts';
import type { Term } from '../../../../src/core/types.ts';

interface Case {
  name: string;
  columns: Record<string, number[]>;
  response: string;
  weights?: string;
  transform?: { fn: 'log' | 'sqrt' };
  terms: Term[];
  expression: string;
  start: Record<string, number>;
}

function close(t: Test, got: number | null, want: number | null, what: string, tolerance = 1e-10) {
  const ok = got !== null && want !== null && Math.abs(got - want) <= tolerance * Math.max(Math.abs(want), 1e-300);
  t.ok(ok, `${what}: ${got} against ${want}`);
}

// NIST StRD Norris (straight line) and Pontius (quadratic), public domain.
const norris = loadStrd('norris');
const pontius = loadStrd('pontius');
// A small process record of our own: cure temperature, dwell time and a
// measured strength, with relative weights (made up for this test).
const cure = {
  temp: [150, 155, 160, 165, 170, 175, 180, 185, 190, 195, 200, 205],
  dwell: [12, 10, 14, 9, 11, 13, 8, 12, 10, 15, 9, 11],
  strength: [31.2, 30.8, 35.9, 31.5, 35.1, 39.8, 33.0, 41.7, 40.2, 48.9, 41.5, 46.3],
  w: [1, 2, 1.5, 1, 0.5, 1, 2, 1, 1.5, 1, 0.8, 1.2],
};

const CASES: Case[] = [
  {
    name: 'Norris', columns: { y: norris.data.y, x: norris.data.x }, response: 'y',
    terms: ['x'], expression: 'b0 + b1*x', start: { b0: 0, b1: 0 },
  },
  {
    name: 'Pontius', columns: { y: pontius.data.y, x: pontius.data.x }, response: 'y',
    terms: ['x', { kind: 'power', of: 'x', degree: 2 }], expression: 'b0 + b1*x + b2*x^2', start: { b0: 0, b1: 0, b2: 0 },
  },
  {
    name: 'cure strength, weighted', columns: cure, response: 'strength', weights: 'w',
    terms: ['temp', 'dwell', { kind: 'product', of: ['temp', 'dwell'] }],
    expression: 'a + b*temp + c*dwell + d*temp*dwell', start: { a: 1, b: 1, c: 1, d: 0 },
  },
  {
    name: 'cure strength, log response', columns: cure, response: 'strength', transform: { fn: 'log' },
    terms: [{ kind: 'transform', of: 'temp', fn: 'log' }, 'dwell'],
    expression: 'a + b*log(temp) + c*dwell', start: { a: 0, b: 0, c: 0 },
  },
];

for (const c of CASES) {
  t.test(c.name, async (t) => {
    const rows = c.columns[c.response].map((_, i) => i);
    const built = buildDesign(c.columns, c.terms, true, rows);
    if ('issues' in built) throw new Error('design');
    const y = responseValues(c.columns, c.response, rows);
    if ('issues' in y) throw new Error('response');
    const w = c.weights ? weightValues(c.columns, c.weights, rows) : null;
    if (w && 'issues' in w) throw new Error('weights');
    const response = c.transform ? transformResponse(y.values, rows, c.transform, ['response']) : { values: y.values, jacobian: 0 };
    if ('issues' in response) throw new Error('transform');
    const linear = fitCandidate({ name: c.name, terms: c.terms, intercept: true, response: c.transform }, built.design, response, w);

    const { fit } = fitted(fitPlain({
      spec: { name: c.name, expression: c.expression, start: c.start, response: c.transform },
      columns: c.columns, y: c.columns[c.response], weights: c.weights ? c.columns[c.weights] : null,
    }));
    linear.result.coefficients.forEach((lc, j) => {
      close(t, fit.coefficients[j].estimate, lc.estimate, `${fit.coefficients[j].term} estimate`);
      close(t, fit.coefficients[j].standardError, lc.standardError, `${fit.coefficients[j].term} standard error`);
    });
    close(t, fit.rss, linear.fit.rss, 'RSS');
    close(t, fit.logLikelihood, linear.result.logLikelihood, 'log-likelihood');
    t.equal(fit.parameters, linear.result.parameters, 'k');
    const weights = w && 'values' in w ? w.values : undefined;
    const hLinear = linearLeverages(linear.fit, built.design, weights);
    const hOurs = nonlinearLeverages(fit);
    t.ok(hOurs.every((h, i) => Math.abs(h - hLinear[i]) <= 1e-10), 'leverages of the hat matrix');
    close(t, nonlinearLeaveOneOut(fit).press, leaveOneOutError(linear.fit, built.design, weights).press, 'PRESS', 1e-9);
  });
}
