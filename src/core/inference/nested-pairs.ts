// Which pairs of candidates to test against each other: every nested pair
// found among them (in candidate order of the smaller, then the larger),
// plus the pairs a request names. A named pair that names an unknown
// candidate or is not nested becomes an issue; a named pair also found
// automatically is tested once. Shared by the linear nested tests and the
// lifetime likelihood-ratio tests, which differ only in what "nested" means
// and what a test computes.
import type { StatisticsIssue } from './issue.ts';

export interface NestedPairRequest {
  smaller: string;
  larger: string;
}

export interface NestingRules<C, O extends { smaller: C; larger: C }, T> {
  /** The pair oriented smaller-inside-larger, or null when neither is nested in the other. */
  order(a: C, b: C): O | null;
  test(order: O): T;
  /** The issue for a requested pair of known candidates that are not nested. */
  notNested(pair: NestedPairRequest, a: C, b: C): StatisticsIssue;
  /** Plain words for a requested pair naming a candidate that is not among them. */
  unknownCandidate: string;
}

export function collectNestedTests<C extends { name: string }, O extends { smaller: C; larger: C }, T>(
  candidates: readonly C[],
  requested: readonly NestedPairRequest[],
  rules: NestingRules<C, O, T>,
): { tests: T[]; issues: StatisticsIssue[] } {
  const tests: T[] = [];
  const issues: StatisticsIssue[] = [];
  const seen = new Set<string>();
  const add = (order: O) => {
    const key = JSON.stringify([order.smaller.name, order.larger.name]);
    if (seen.has(key)) return;
    seen.add(key);
    tests.push(rules.test(order));
  };
  for (let i = 0; i < candidates.length; i++) {
    for (let j = i + 1; j < candidates.length; j++) {
      const order = rules.order(candidates[i], candidates[j]);
      if (order) add(order);
    }
  }
  const byName = new Map(candidates.map((c) => [c.name, c]));
  for (const pair of requested) {
    const a = byName.get(pair.smaller);
    const b = byName.get(pair.larger);
    if (!a || !b) {
      issues.push({
        code: 'nested-test-unknown-candidate',
        message: `${rules.unknownCandidate} The candidate in question: ${JSON.stringify(!a ? pair.smaller : pair.larger)}.`,
        facts: { smaller: pair.smaller, larger: pair.larger, missing: !a ? pair.smaller : pair.larger },
      });
      continue;
    }
    const order = rules.order(a, b);
    if (!order) issues.push(rules.notNested(pair, a, b));
    else add(order);
  }
  return { tests, issues };
}
