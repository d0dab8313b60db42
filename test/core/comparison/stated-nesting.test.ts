// Which named pairs are tested on the caller's word: a pair with a model that
// has no design columns to compare (a nonlinear expression) and least-squares
// sums on both sides; two linear designs stay with the column-key rules, and
// a model with no residual sum of squares is left to them to refuse. The
// statistics themselves are checked against R's anova() in
// test/core/models/nonlinear/r-nls.test.ts and test/http/nonlinear-nested.test.ts.
import t from 'tap';
import { STATED_NESTING, statedNestingTests } from '../../../src/core/comparison/extras/stated-nesting.ts';
import type { ModelCapabilities, ScoredModel } from '../../../src/core/models/scored-model.ts';

function model(name: string, rss: number, meanParameters: number, kind: 'linear' | 'nonlinear' | 'other', exactFit = false): ScoredModel {
  const facts: ModelCapabilities['leastSquaresFacts'] = (sample) => ({ name, rss, meanParameters, observations: 30, sample, exactFit });
  const capabilities: ModelCapabilities = kind === 'other' ? {} : {
    leastSquaresFacts: facts,
    ...(kind === 'linear' ? { nested: () => ({ candidate: { name }, rules: {} as never }) } : {}),
  };
  return { name, capabilities } as unknown as ScoredModel;
}

const models = [
  model('line', 500, 2, 'linear'), model('quadratic', 60, 3, 'linear'),
  model('vertex', 300, 2, 'nonlinear'), model('plateau', 50, 3, 'nonlinear'),
  model('stated', 0, 2, 'other'), model('exact', 0, 4, 'nonlinear', true),
];

t.test('pairs with an expression are tested here, each once, and say so', async (t) => {
  const out = statedNestingTests(models, 's', [
    { smaller: 'line', larger: 'quadratic' },
    { smaller: 'vertex', larger: 'quadratic' },
    { smaller: 'vertex', larger: 'plateau' },
    { smaller: 'vertex', larger: 'quadratic' },
    { smaller: 'vertex', larger: 'stated' },
    { smaller: 'vertex', larger: 'nowhere' },
  ]);
  t.same(out.rest, [{ smaller: 'line', larger: 'quadratic' }, { smaller: 'vertex', larger: 'stated' }, { smaller: 'vertex', larger: 'nowhere' }], 'linear pairs and unknown or non-least-squares names go to the column rules');
  t.same(out.tests.map((x) => [x.smaller, x.larger]), [['vertex', 'quadratic'], ['vertex', 'plateau']], 'a pair named twice is tested once');
  for (const test of out.tests) t.equal(test.reason, STATED_NESTING);
  // F = ((300 − 60)/1) / (60/27) = 108 (by hand).
  t.ok(Math.abs(out.tests[0].fStatistic! - 108) < 1e-12, 'F from the two sums');
  t.same(out.issues, []);
});

t.test('an exact fit keeps its own reason beside the caller\'s word; a refuted pair is an issue', async (t) => {
  const exact = statedNestingTests(models, 's', [{ smaller: 'plateau', larger: 'exact' }]);
  t.equal(exact.tests[0].fStatistic, null);
  t.match(exact.tests[0].reason, /fits the data exactly.*Nested on the caller's word/);
  const refuted = statedNestingTests(models, 's', [{ smaller: 'plateau', larger: 'vertex' }]);
  t.equal(refuted.tests.length, 0);
  t.match(refuted.issues, [{ code: 'nested-test-not-nested', facts: { smaller: 'plateau', larger: 'vertex' } }]);
});
