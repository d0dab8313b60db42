// The price of a generalised-linear subset search. Every subset is an IRLS
// fit, priced as the fit of a comparison candidate is (models/glm/pricing.ts:
// its iteration cap of weighted QR solves of n rows by the subset's columns,
// the null model and the separation check), at the width of the widest
// subset, the whole pool; the warm start from a parent usually saves steps,
// but the price is for the cap, not the hope. The search fits
// (subsets visited) × that, so the price sets how many fits the search may
// make: every subset when they all fit in what the work cap leaves, else a
// number of fits for stepwise selection with swaps, never fewer than one
// forward pass (1 + m fits) — below that the request is over the cap, a 422.
import { GLM_EXHAUSTIVE_TERMS } from '../search/glm/glm-search.ts';
import { DEFAULT_SEARCH_BUDGET, type SearchBudget } from '../search/index.ts';
import type { SearchRequestInput } from '../search/request-problem.ts';
import type { GlmSearchSpec } from '../search/glm/types.ts';
import { priceGlm } from '../models/glm/pricing.ts';
import { GLM_FLOPS_PER_UNIT } from '../models/glm/price.ts';
import { NO_DATA, shapeOfColumns } from './data-shape.ts';
import { searchWidth } from './search-width.ts';
import { ANSWER_BYTES, FIXED_WORK } from './least-squares-cost.ts';
import { totalPrice, type PriceCaps, type PricePart, type RequestPrice } from './types.ts';

const REMEDY = 'Narrow the pool, move terms to always, drop factors with many levels from it, or ask for fewer top models';

/** search-price.ts's options and answer, spelled out here so the two files do not import each other. */
export function priceGlmSearch(
  input: SearchRequestInput & { glm: GlmSearchSpec },
  options: { caps: PriceCaps; exhaustive: boolean; budget?: SearchBudget },
): { price: RequestPrice; budget: SearchBudget } {
  const budget = options.budget ?? DEFAULT_SEARCH_BUDGET;
  const shape = input.columns ? shapeOfColumns(input.columns) : NO_DATA;
  const n = shape.rows;
  const { width, w, d, m, alwaysWidth } = searchWidth(input, shape, options.caps.designColumns.limit);
  const perFit = priceGlm({ rows: n, columns: w, family: input.glm.family, link: input.glm.link }) / GLM_FLOPS_PER_UNIT;
  // Held while the search runs: the design over every term (double-double), response, trials, offset; each fit's own
  // design, weighted copy and QR pass as it goes, one fit at a time.
  const fitHeld = 8 * n * w + 56 * n + 8 * w * w;
  const prepare: PricePart = {
    ...part(`the design of ${width.atLeast ? 'more than ' : ''}${w} columns on ${n} rows, checked and built once more for the fits`, ['pool'], 10 * n * (3 * w + m * alwaysWidth) + n * d * d),
    heldBytes: 16 * n * w + 24 * n,
    passingBytes: 24 * n * w + 8 * n * d,
    designColumns: w,
  };
  const widest = width.perTerm.indexOf(Math.max(...width.perTerm));
  if (widest >= 0) prepare.path = widest < m ? ['pool', widest] : ['always', widest - m];
  const resultBytes = ANSWER_BYTES.base + input.top * (ANSWER_BYTES.model + w * ANSWER_BYTES.coefficient) + m * ANSWER_BYTES.averagedTerm;
  const report: PricePart = {
    ...part(`refitting the best ${input.top} subsets by IRLS`, ['top'], input.top * (FIXED_WORK.modelFittedHere + perFit) + FIXED_WORK.answerByte * resultBytes),
    passingBytes: fitHeld + 32 * n * w,
    resultBytes,
  };
  const all = 2 ** m;
  const allowance = Math.max(0, options.caps.work.limit - prepare.work - report.work);
  const affordable = perFit > 0 ? Math.floor(allowance / perFit) : Number.MAX_SAFE_INTEGER;
  const small = m <= GLM_EXHAUSTIVE_TERMS;
  let fits: number;
  let effective: SearchBudget;
  let what: string;
  if (small && (all <= affordable || options.exhaustive)) {
    fits = all;
    effective = { ...budget, maxSubsets: all, maxNodes: all };
    what = `fitting all ${all} subsets of ${m} pool terms by IRLS`;
  } else if (options.exhaustive) {
    // Beyond the subset limit itself: the search's plan refuses it, naming that limit, before any fit.
    fits = 0;
    effective = { ...budget, maxSubsets: 2 ** GLM_EXHAUSTIVE_TERMS };
    what = `fitting every subset of ${m} pool terms by IRLS`;
  } else {
    fits = Math.max(1 + m, Math.min(budget.maxNodes, affordable));
    effective = { ...budget, maxSubsets: Math.min(affordable, 2 ** GLM_EXHAUSTIVE_TERMS), maxNodes: fits };
    what = `stepwise selection with swaps over ${m} pool terms, within ${fits} IRLS fits`;
  }
  const kernel: PricePart = { ...part(what, ['pool'], fits * perFit), passingBytes: fitHeld + 32 * n * w };
  return { price: totalPrice([prepare, kernel, report]), budget: effective };
}

function part(what: string, path: (string | number)[], work: number): PricePart {
  return { what, path, work, heldBytes: 0, passingBytes: 0, resultBytes: 0, designColumns: null, remedy: REMEDY };
}
