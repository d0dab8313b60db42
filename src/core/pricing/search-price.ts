// The price of a subset search, and the search budget it implies. The design
// over every pool and always term has w columns; the kernel's cross-product
// matrix is d = w (less the intercept) + 1 for the response. Scoring one
// subset copies its parent's d×d matrix (a memory copy, priced at half a
// multiply-add per entry) and sweeps its last term's block in (b pivots of
// d² each), so the kernel costs (½ + b̄) d² per subset — the
// width matters as much as the count, which a budget counted in subsets
// alone cannot see. Preparing (the design and one pass for its cross
// products, n d²) and refitting the best `top` on the rows come on top.
//
// The work cap is turned into the budget the kernel runs under: an
// exhaustive walk when every subset fits in what the cap leaves, otherwise
// branch and bound with as many tree nodes as fit (a node costs about two
// sweeps), so a wide pool searches what it can afford instead of an hour.
import { DEFAULT_SEARCH_BUDGET, MAX_EXHAUSTIVE_TERMS, type SearchBudget } from '../search/index.ts';
import type { SearchRequestInput } from '../search/request-problem.ts';
import { NO_DATA, shapeOfColumns, shapeOfSummary } from './data-shape.ts';
import { searchWidth } from './search-width.ts';
import { ANSWER_BYTES, FIXED_WORK, leastSquaresFit, leastSquaresFromSummary } from './least-squares-cost.ts';
import { priceGlmSearch } from './glm-search-price.ts';
import { totalPrice, type PriceCaps, type PricePart, type RequestPrice } from './types.ts';

/** Fewer nodes than this could not settle the top of any pool worth a branch and bound. */
export const MIN_BRANCH_AND_BOUND_NODES = 4096;

export interface SearchPricing {
  price: RequestPrice;
  /** The budget the kernel runs under: the default, narrowed to what the work cap leaves. */
  budget: SearchBudget;
}

export interface SearchPricingOptions {
  caps: PriceCaps;
  exhaustive: boolean;
  /** Workers that may run pieces of the kernel at once (each holds its own matrices). */
  parallelism: number;
  budget?: SearchBudget;
}

const SEARCH_REMEDY = 'Narrow the pool, move terms to always, drop factors with many levels from it, or ask for fewer top models';

export function priceSearch(input: SearchRequestInput, options: SearchPricingOptions): SearchPricing {
  // Every subset an IRLS fit, not a sweep of cross products: priced by fits.
  if (input.glm && input.columns) return priceGlmSearch({ ...input, glm: input.glm }, options);
  const budget = options.budget ?? DEFAULT_SEARCH_BUDGET;
  const shape = input.summary ? shapeOfSummary(input.summary) : input.columns ? shapeOfColumns(input.columns) : NO_DATA;
  const n = shape.rows;
  const { width, w, d, m, alwaysWidth } = searchWidth(input, shape, options.caps.designColumns.limit);
  const meanBlock = m === 0 ? 0 : width.perTerm.slice(0, m).reduce((a, b) => a + b, 0) / m;
  const perSubset = (0.5 + meanBlock) * d * d;

  const prepare: PricePart = input.summary
    ? { ...part('checking the summary and its cross products', ['data', 'summary'], (input.summary.columns.length ** 3) / 3 + d * d), heldBytes: 0, passingBytes: 8 * input.summary.columns.length ** 2 }
    : {
      // The design (double-double), each pool term built once more with the always terms to check its coding, and one pass for the cross products.
      ...part(`the design of ${width.atLeast ? 'more than ' : ''}${w} columns on ${n} rows and its cross products`, ['pool'], 10 * n * (2 * w + m * alwaysWidth) + n * d * d),
      heldBytes: 0,
      passingBytes: 24 * n * w + 8 * n * d,
    };
  prepare.designColumns = w;
  const widest = width.perTerm.indexOf(Math.max(...width.perTerm));
  if (widest >= 0) prepare.path = widest < m ? ['pool', widest] : ['always', widest - m];
  const refit = input.summary ? leastSquaresFromSummary(w) : leastSquaresFit(n, w, false);
  const resultBytes = ANSWER_BYTES.base + input.top * refit.resultBytes + m * ANSWER_BYTES.averagedTerm;
  const report: PricePart = {
    ...part(`refitting the best ${input.top} subsets`, ['top'], input.top * refit.work + FIXED_WORK.answerByte * resultBytes),
    heldBytes: 0,
    passingBytes: refit.heldBytes + refit.passingBytes,
    resultBytes,
  };

  const all = 2 ** m;
  const allowance = Math.max(0, options.caps.work.limit - prepare.work - report.work);
  const withinBudget = all <= budget.maxSubsets && m <= MAX_EXHAUSTIVE_TERMS;
  let method: 'exhaustive' | 'branchAndBound';
  let kernelWork: number;
  let effective = budget;
  if (withinBudget && (all * perSubset <= allowance || options.exhaustive)) {
    method = 'exhaustive';
    kernelWork = all * perSubset;
  } else if (options.exhaustive || m > budget.maxBranchAndBoundTerms) {
    // Beyond the subset budget itself: the search's own plan refuses it, naming that budget, before the kernel starts.
    method = options.exhaustive ? 'exhaustive' : 'branchAndBound';
    kernelWork = 0;
  } else {
    method = 'branchAndBound';
    const nodes = Math.max(MIN_BRANCH_AND_BOUND_NODES, Math.min(budget.maxNodes, Math.floor(allowance / (2 * perSubset))));
    effective = { ...budget, maxSubsets: Math.min(budget.maxSubsets, Math.floor(allowance / perSubset)), maxNodes: nodes };
    kernelWork = nodes * 2 * perSubset;
  }
  // Each running piece holds one d×d matrix per term count (two for branch and bound) and a copy of the problem.
  const matricesPerPiece = (method === 'exhaustive' ? 1 : 2) * (m + 1) + 1;
  const kernel: PricePart = {
    ...part(
      method === 'exhaustive' ? `scoring all ${all} subsets of ${m} pool terms over ${d} cross-product columns` : `branch and bound over ${m} pool terms and ${d} cross-product columns, within ${effective.maxNodes} tree nodes`,
      ['pool'],
      kernelWork,
    ),
    heldBytes: 0,
    passingBytes: Math.max(1, options.parallelism) * matricesPerPiece * 8 * d * d,
  };
  return { price: totalPrice([prepare, kernel, report]), budget: effective };
}

function part(what: string, path: (string | number)[], work: number): PricePart {
  return { what, path, work, heldBytes: 0, passingBytes: 0, resultBytes: 0, designColumns: null, remedy: SEARCH_REMEDY };
}
