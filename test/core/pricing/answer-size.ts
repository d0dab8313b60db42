// The answer-size estimate checked against the measured JSON of a real
// comparison: an upper bound, within a factor of four (shared by the pricing
// tests of every kind).
import type { Test } from 'tap';
import { compareModels, type ComparisonInput } from '../../../src/core/compare.ts';
import { priceComparison } from '../../../src/core/pricing/index.ts';

export function answerSizeBounds(t: Test, name: string, input: ComparisonInput): void {
  const price = priceComparison(input, null, 2000);
  const out = compareModels(input);
  if ('issues' in out) throw new Error(out.issues[0].message);
  const measured = Buffer.byteLength(JSON.stringify(out.result));
  t.ok(price.resultBytes >= measured, `${name}: estimate ${price.resultBytes} ≥ measured ${measured}`);
  t.ok(price.resultBytes <= 4 * measured, `${name}: estimate within 4× of ${measured}`);
}
