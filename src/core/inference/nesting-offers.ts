// Nested-model tests across the kinds of model in one comparison. Each model
// that can be tested offers itself under its kind's rules (what "nested" means
// and what a test computes: least squares' partial F, a generalised linear
// model's deviance tests, ...). Models are paired only with models under the
// same rules object, so a least-squares fit is never tested against a GLM;
// a pair the request names across two kinds is refused with the reason.
import type { StatisticsIssue } from './issue.ts';
import type { NestedTest } from './nested.ts';
import { collectNestedTests, type NestedPairRequest, type NestingRules } from './nested-pairs.ts';

/** One model offered to the nested tests: itself, under its kind's rules. */
export interface NestingOffer<C extends { name: string } = { name: string }> {
  candidate: C;
  rules: NestingRules<C, { smaller: C; larger: C }, NestedTest>;
}

const UNKNOWN_CANDIDATE = 'A requested nested test names a candidate that is not among those compared, or one whose kind is not tested on request: requested tests pair least-squares models fitted here (linear, or nonlinear on the caller\'s word), or generalised linear models fitted here of one family and link (a model fitted elsewhere has nothing to test; a pair naming a life model is tested by the likelihood-ratio test between life models).';

/** Every nested pair within each kind's offers (candidate order), plus the pairs the request names. */
export function testNestingOffers(
  offers: readonly NestingOffer[],
  requested: readonly NestedPairRequest[] = [],
): { tests: NestedTest[]; issues: StatisticsIssue[] } {
  const groups = new Map<NestingOffer['rules'], NestingOffer['candidate'][]>();
  const rulesOf = new Map<string, NestingOffer['rules']>();
  for (const offer of offers) {
    groups.set(offer.rules, [...(groups.get(offer.rules) ?? []), offer.candidate]);
    rulesOf.set(offer.candidate.name, offer.rules);
  }
  const tests: NestedTest[] = [];
  const issues: StatisticsIssue[] = [];
  const routed = new Map<NestingOffer['rules'], NestedPairRequest[]>();
  for (const pair of requested) {
    const a = rulesOf.get(pair.smaller);
    const b = rulesOf.get(pair.larger);
    if (!a || !b) {
      const missing = !a ? pair.smaller : pair.larger;
      issues.push({
        code: 'nested-test-unknown-candidate',
        message: `${UNKNOWN_CANDIDATE} The candidate in question: ${JSON.stringify(missing)}.`,
        facts: { smaller: pair.smaller, larger: pair.larger, missing },
      });
    } else if (a !== b) {
      issues.push({
        code: 'nested-test-not-nested',
        message: `"${pair.smaller}" and "${pair.larger}" are different kinds of model (least squares beside a generalised linear model, for example), so neither is a restricted case of the other under one test.`,
        facts: { smaller: pair.smaller, larger: pair.larger },
      });
    } else routed.set(a, [...(routed.get(a) ?? []), pair]);
  }
  for (const [rules, candidates] of groups) {
    const found = collectNestedTests(candidates, routed.get(rules) ?? [], rules);
    tests.push(...found.tests);
    issues.push(...found.issues);
  }
  return { tests, issues };
}
