// The price of a search from its shape (src/core/search/price.ts), worked by
// hand from the stated unit costs: a sweep with its copy is 3 d^2 operations;
// exhaustive holds one d-by-d matrix per term count per thread; branch and
// bound holds two per depth plus one per thread, and three for the plan.

import t from 'tap';
import { DEFAULT_SEARCH_BUDGET, priceSearch } from '../../../src/core/search/index.ts';

t.test('exhaustive: one sweep per subset', (t) => {
  const price = priceSearch({ poolTerms: 20, dimension: 21, method: 'exhaustive', threads: 2 }, DEFAULT_SEARCH_BUDGET);
  t.equal(price.flops, 2 ** 20 * 3 * 21 * 21);
  t.equal(price.bytes, 2 * 21 * 21 * 21 * 8, '21 levels of 21 x 21 doubles on each of 2 threads');
  t.end();
});

t.test('branch and bound: bounded by its node budget, and rising with it', (t) => {
  const shape = { poolTerms: 40, dimension: 41, method: 'branchAndBound' as const, threads: 2 };
  const price = priceSearch(shape, DEFAULT_SEARCH_BUDGET);
  const sweep = 3 * 41 * 41;
  // Nodes alone: 2^24 nodes of at most 2 + 40 sweeps each.
  t.ok(price.flops >= 2 ** 24 * 42 * sweep);
  t.ok(price.flops < 2 * 2 ** 24 * 42 * sweep, 'the start and the plan are a small part of it');
  t.equal(price.bytes, 2 * (2 * 41 + 1) * 41 * 41 * 8 + 3 * 41 * 41 * 8);
  const halved = priceSearch(shape, { ...DEFAULT_SEARCH_BUDGET, maxNodes: 2 ** 23 });
  t.ok(halved.flops < price.flops, 'a smaller node budget prices lower');
  t.end();
});
