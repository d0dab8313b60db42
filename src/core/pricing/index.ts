// Every request priced before it runs: its work, memory and answer size
// estimated from its shape, held against the caps.
export type { Cap, PriceCaps, PricePart, RequestPrice } from './types.ts';
export { priceComparison } from './comparison-price.ts';
export { priceSearch, MIN_BRANCH_AND_BOUND_NODES, type SearchPricing, type SearchPricingOptions } from './search-price.ts';
export { priceIssues } from './limits.ts';
export { CANDIDATE_PRICES, type CandidatePricer, type CandidateCost, type CandidateContext } from './candidate-prices.ts';
export { ANSWER_BYTES } from './least-squares-cost.ts';
