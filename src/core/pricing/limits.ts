// A price held against the caps. Each refusal names the estimate, the cap,
// its setting and what to change; the design-column cap is checked per model
// (first, since a design past it makes every other estimate moot).
import { issue, type Issue } from '../issues.ts';
import type { PriceCaps, PricePart, RequestPrice } from './types.ts';

function largest(parts: PricePart[], by: (p: PricePart) => number): PricePart {
  return parts.reduce((a, b) => (by(b) > by(a) ? b : a));
}

export function priceIssues(price: RequestPrice, caps: PriceCaps): Issue[] {
  const issues: Issue[] = [];
  for (const part of price.parts) {
    if (part.designColumns !== null && part.designColumns > caps.designColumns.limit) {
      issues.push(issue('design_columns_limit', part.path, { columns: part.designColumns, what: part.what, ...caps.designColumns }));
    }
  }
  if (issues.length > 0) return issues;
  if (price.work > caps.work.limit) {
    const top = largest(price.parts, (p) => p.work);
    issues.push(issue('work_limit', top.path, { estimate: Math.ceil(price.work), ...caps.work, unit: 'multiply-adds', largest: top.what, remedy: top.remedy }));
  }
  if (price.memoryBytes > caps.memoryBytes.limit) {
    const top = largest(price.parts, (p) => p.heldBytes + p.passingBytes);
    issues.push(issue('memory_limit', top.path, { estimate: Math.ceil(price.memoryBytes), ...caps.memoryBytes, unit: 'bytes', largest: top.what, remedy: top.remedy }));
  }
  if (price.resultBytes > caps.resultBytes.limit) {
    const top = largest(price.parts, (p) => p.resultBytes);
    issues.push(issue('result_size_limit', top.path, { estimate: Math.ceil(price.resultBytes), ...caps.resultBytes, unit: 'bytes', measured: false, largest: top.what, remedy: top.remedy }));
  }
  return issues;
}
