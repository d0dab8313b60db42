// The reference for the search tests: every subset fitted on the rows by the
// service's QR engine (src/core/fit, itself checked against NIST StRD) and
// scored by the shared criterion code — what a comparison of every subset
// would report.

import { buildDesign, commonRows, columnsUsedBy, responseValues } from '../../../src/core/design/index.ts';
import { fitLeastSquares } from '../../../src/core/fit/index.ts';
import { computeCriteria } from '../../../src/core/scoring/criteria.ts';
import { gaussianLogLikelihood } from '../../../src/core/likelihood.ts';
import { akaikeWeights } from '../../../src/core/scoring/ranking.ts';
import { hierarchyRules, noHierarchy, subsetProblemFromDesign, type SearchCriterion, type SubsetProblem } from '../../../src/core/search/index.ts';
import type { Columns, Term } from '../../../src/core/types.ts';

export interface SearchCase {
  columns: Columns;
  response: string;
  pool: Term[];
  always: Term[];
  intercept: boolean;
  hierarchy: boolean;
}

export function problemFor(c: SearchCase): { problem: SubsetProblem; rows: number[] } {
  const rows = commonRows(c.columns, [c.response, ...columnsUsedBy([...c.pool, ...c.always])]).rows;
  const built = buildDesign(c.columns, [...c.pool, ...c.always], c.intercept, rows);
  if (!('design' in built)) throw new Error(JSON.stringify(built.issues));
  const y = responseValues(c.columns, c.response, rows);
  if (!('values' in y)) throw new Error('response');
  const rules = c.hierarchy ? hierarchyRules(c.pool, c.always) : noHierarchy(c.pool.length);
  return { problem: subsetProblemFromDesign(built.design, y.values, null, c.pool.length, rules), rows };
}

export interface BruteForceModel {
  terms: number[];
  value: number;
  rss: number;
  parameters: number;
}

/** Every admissible subset, fitted by QR on the rows; criterion values, Akaike weights and importance. */
export function bruteForce(c: SearchCase, criterion: SearchCriterion): { models: (BruteForceModel & { weight: number })[]; importance: number[] } {
  const { rows } = problemFor(c);
  const rules = c.hierarchy ? hierarchyRules(c.pool, c.always) : noHierarchy(c.pool.length);
  const m = c.pool.length;
  const y = responseValues(c.columns, c.response, rows);
  if (!('values' in y)) throw new Error('response');
  const models: BruteForceModel[] = [];
  for (let mask = 0; mask < 2 ** m; mask++) {
    const terms = [...Array(m).keys()].filter((t) => (mask >>> t) & 1);
    const inSet = new Set(terms);
    if (terms.some((t) => rules.requires[t].some((r) => !inSet.has(r)) || rules.unreachable.some((u) => u.term === t))) continue;
    const built = buildDesign(c.columns, [...terms.map((t) => c.pool[t]), ...c.always], c.intercept, rows);
    if (!('design' in built)) throw new Error(JSON.stringify(built.issues));
    const fit = fitLeastSquares(built.design, y.values);
    const criteria = computeCriteria({
      logLikelihood: gaussianLogLikelihood({ n: fit.observations, rss: fit.rss }),
      parameters: fit.rank + 1,
      observations: fit.observations,
      rss: fit.rss,
      tss: fit.tss,
      coefficientsIncludingIntercept: fit.rank,
      intercept: c.intercept,
    });
    const value = criteria[criterion];
    if (value === null) continue;
    models.push({ terms, value, rss: fit.rss, parameters: fit.rank + 1 });
  }
  const weights = akaikeWeights(models.map((x) => x.value));
  const importance = new Array<number>(m).fill(0);
  models.forEach((x, i) => x.terms.forEach((t) => (importance[t] += weights[i])));
  const ranked = models.map((x, i) => ({ ...x, weight: weights[i] }));
  ranked.sort((a, b) => a.value - b.value || a.terms.length - b.terms.length);
  return { models: ranked, importance };
}

/** The demo scenario's columns as a 16-term pool: numeric terms, a factor, powers, products, transforms. */
export const demoPool: Term[] = [
  'peakTemp', 'holdMinutes', 'moisture', { kind: 'factor', of: 'kiln' },
  { kind: 'power', of: 'peakTemp', degree: 2 }, { kind: 'power', of: 'holdMinutes', degree: 2 },
  { kind: 'power', of: 'moisture', degree: 2 }, { kind: 'product', of: ['peakTemp', 'holdMinutes'] },
  { kind: 'product', of: ['peakTemp', 'moisture'] }, { kind: 'product', of: ['holdMinutes', 'moisture'] },
  { kind: 'product', of: ['peakTemp', 'kiln'] }, { kind: 'product', of: ['moisture', 'kiln'] },
  { kind: 'transform', of: 'moisture', fn: 'log' }, { kind: 'transform', of: 'holdMinutes', fn: 'sqrt' },
  { kind: 'product', of: ['holdMinutes', 'kiln'] }, { kind: 'power', of: 'peakTemp', degree: 3 },
];
