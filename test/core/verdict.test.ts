// The verdict: agreement, the picks grouped by model, the leanings stated in
// words, and the criterion the request ranks by. Rankings are built with
// rankModels from values chosen so the picks are known by inspection.
import t from 'tap';
import { rankModels } from '../../src/core/scoring/ranking.ts';
import { verdict } from '../../src/core/scoring/verdict.ts';

function ranking(values: Record<string, number | null>, direction: 'smaller' | 'larger' = 'smaller') {
  return rankModels(Object.entries(values).map(([name, value]) => ({ name, value })), { direction, weighted: direction === 'smaller' });
}

const parameters = { linear: 3, quadratic: 4, 'by-kiln': 6 };
const disagreeing = {
  aic: ranking({ linear: 10, quadratic: 8, 'by-kiln': 9 }),
  aicc: ranking({ linear: 10, quadratic: 8, 'by-kiln': 12 }),
  bic: ranking({ linear: 10, quadratic: 11, 'by-kiln': 14 }),
  hqc: ranking({ linear: 10, quadratic: 9, 'by-kiln': 12 }),
  adjustedR2: ranking({ linear: 0.5, quadratic: 0.6, 'by-kiln': 0.7 }, 'larger'),
};

t.test('agreement', async (t) => {
  const all = Object.fromEntries(Object.entries(disagreeing).map(([c]) =>
    [c, ranking(c === 'adjustedR2' ? { linear: 0.1, quadratic: 0.2 } : { linear: 10, quadratic: 8 }, c === 'adjustedR2' ? 'larger' : 'smaller')]));
  const v = verdict(all, 'aicc', { parameters });
  t.equal(v.agree, true);
  t.equal(v.chosen, 'quadratic');
  t.same(v.best, { aic: 'quadratic', aicc: 'quadratic', bic: 'quadratic', hqc: 'quadratic', adjustedR2: 'quadratic' });
  t.equal(v.summary, 'All five criteria pick "quadratic" (4 parameters).');
});

t.test('disagreement: who picks what, which way each leans, what rankBy chose', async (t) => {
  const v = verdict(disagreeing, 'aicc', { parameters, observations: 40 });
  t.equal(v.agree, false);
  t.same(v.best, { aic: 'quadratic', aicc: 'quadratic', bic: 'linear', hqc: 'quadratic', adjustedR2: 'by-kiln' });
  t.equal(v.chosen, 'quadratic');
  t.same(v.leanings.map((l) => [l.model, l.parameters, l.criteria]),
    [['by-kiln', 6, ['adjustedR2']], ['quadratic', 4, ['aic', 'aicc', 'hqc']], ['linear', 3, ['bic']]]);
  t.match(v.summary, /^The criteria disagree: adjusted R² picks "by-kiln" \(6 parameters\); AIC, AICc and HQC pick "quadratic" \(4\); BIC picks "linear" \(3\)\./);
  // At n = 40: 2 ln(ln 40) = 2.61 and ln 40 = 3.69, so the order is adjusted R², AIC, AICc, HQC, BIC.
  t.match(v.summary, /adjusted R² about n\/\(n - p\), near 1 unless n is small, AIC 2, AICc a little over 2, HQC 2 ln\(ln n\) = 2\.61 and BIC ln n = 3\.69/);
  t.match(v.summary, /Ranked by AICc, .* the choice is "quadratic"\.$/);
  t.equal(verdict(disagreeing, 'bic', { parameters }).chosen, 'linear');
});

t.test('at small n the stated charges follow n (ln 7 < 2: BIC charges less than AIC)', async (t) => {
  const v = verdict(disagreeing, 'aicc', { parameters, observations: 7 });
  // 2 ln(ln 7) = 1.33, ln 7 = 1.95: both below AIC's 2.
  t.match(v.summary, /adjusted R² about n\/\(n - p\), near 1 unless n is small, HQC 2 ln\(ln n\) = 1\.33, BIC ln n = 1\.95, AIC 2 and AICc a little over 2/);
});

t.test('criteria that rank no model, ties for first, and nothing at all', async (t) => {
  const v = verdict({ aic: ranking({ a: 1, b: 3 }), aicc: ranking({ a: null, b: null }) }, 'aicc', { parameters: { a: 2, b: 3 } });
  t.equal(v.agree, true);
  t.equal(v.chosen, null);
  t.equal(v.best.aicc, null);
  t.equal(v.best.bic, null, 'not given');
  t.match(v.summary, /AIC picks "a" \(2 parameters\)\. AICc could not rank any model/);
  t.match(v.summary, /ranks no model, so none is chosen/);

  const tie = verdict({ aic: ranking({ b: 1, a: 1 }) }, 'aic');
  t.same(tie.tiesForFirst, { aic: ['a', 'b'] });
  t.equal(tie.chosen, 'a');
  t.match(tie.summary, /"a" and "b" tie for first/);

  const none = verdict({}, 'aicc');
  t.equal(none.agree, false);
  t.equal(none.chosen, null);
  t.type(none.summary, 'string');
});
