// Pricing at the door: the request as the core will see it, priced from its
// shape (src/core/pricing) and held against the caps before anything is built.
import { priceComparison, priceIssues, priceSearch, type PriceCaps, type RequestPrice } from '../../core/pricing/index.ts';
import type { Issue } from '../../core/issues.ts';
import type { SearchBudget } from '../../core/search/index.ts';
import type { ActivePolicy } from '../../policy-file.ts';
import { toComparisonInput } from '../comparison-input.ts';
import { toSearchInput } from '../search-input.ts';
import type { ComparisonRequest } from '../schemas/comparison-request.ts';
import type { SearchRequest } from '../schemas/search-request.ts';

export function priceComparisonRequest(body: ComparisonRequest, policy: ActivePolicy, caps: PriceCaps): { price: RequestPrice } | { issues: Issue[] } {
  const summary = body.data && 'summary' in body.data ? body.data.summary : null;
  const price = priceComparison(toComparisonInput(body, policy), summary, caps.designColumns.limit);
  const issues = priceIssues(price, caps);
  return issues.length > 0 ? { issues } : { price };
}

export function priceSearchRequest(body: SearchRequest, caps: PriceCaps, parallelism: number): { price: RequestPrice; budget: SearchBudget } | { issues: Issue[] } {
  const priced = priceSearch(toSearchInput(body), { caps, exhaustive: body.exhaustive, parallelism });
  const issues = priceIssues(priced.price, caps);
  return issues.length > 0 ? { issues } : priced;
}
