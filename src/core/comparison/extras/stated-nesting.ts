// Nested tests for pairs the caller names in options.tests where at least one
// model is not a linear design — a nonlinear expression beside a linear or
// another nonlinear model. Column keys decide nesting between linear designs
// (inference/nested.ts); an expression has no columns, and whether one
// expression is a special case of another cannot be read off the two in
// general, so such a pair is tested as the caller states it: the
// extra-sum-of-squares F test and the likelihood-ratio test
// (models/nonlinear/extra-sum-of-squares.ts), after the checks that can be
// made (same sample, fewer parameters in the smaller model, a larger model
// fitting at least as well). Each such test says, in `reason`, that nesting
// was taken on the caller's word.
import type { NestedPairRequest, NestedTest } from '../../inference/nested.ts';
import type { StatisticsIssue } from '../../inference/issue.ts';
import { extraSumOfSquaresTest } from '../../models/nonlinear/extra-sum-of-squares.ts';
import type { ScoredModel } from '../../models/scored-model.ts';

export const STATED_NESTING =
  'Nested on the caller\'s word (options.tests): whether one model is a special case of the other cannot be read off an expression, so it was not checked; only the same sample, fewer parameters in the smaller model and a larger model fitting at least as well were. For a nonlinear model the F and χ² reference distributions are linearisations.';

export interface StatedNestingTests {
  tests: NestedTest[];
  issues: StatisticsIssue[];
  /** The requested pairs left to the column-key rules (both linear designs, or a name those rules will refuse). */
  rest: NestedPairRequest[];
}

export function statedNestingTests(
  scored: readonly ScoredModel[],
  sample: string,
  requested: readonly NestedPairRequest[],
): StatedNestingTests {
  const byName = new Map(scored.map((m) => [m.name, m]));
  const out: StatedNestingTests = { tests: [], issues: [], rest: [] };
  const seen = new Set<string>();
  for (const pair of requested) {
    const a = byName.get(pair.smaller)?.capabilities;
    const b = byName.get(pair.larger)?.capabilities;
    const stated = a?.leastSquaresFacts && b?.leastSquaresFacts && !(a.nested && b.nested);
    if (!stated) {
      out.rest.push(pair);
      continue;
    }
    const key = JSON.stringify([pair.smaller, pair.larger]);
    if (seen.has(key)) continue;
    seen.add(key);
    const made = extraSumOfSquaresTest(a.leastSquaresFacts!(sample), b.leastSquaresFacts!(sample));
    if ('issue' in made) out.issues.push(made.issue);
    else out.tests.push({ ...made.test, reason: made.test.reason === null ? STATED_NESTING : `${made.test.reason} ${STATED_NESTING}` });
  }
  return out;
}
