// The verdict and the choice of rankBy when a comparison also ranks by QAIC
// and QAICc (a ĉ from options.overdispersion). Rankings are built with
// rankModels from values chosen so the picks are known by inspection; the
// charge of QAIC per parameter, 2 on −2 log L / ĉ and so 2ĉ on −2 log L, is
// Burnham & Anderson (2002), §2.5.
import t from 'tap';
import { rankModels } from '../../src/core/scoring/ranking.ts';
import { verdict } from '../../src/core/scoring/verdict.ts';
import { chooseRankBy, DEFAULT_POLICY, deltaBand } from '../../src/core/scoring/policy.ts';
import { isQuasiCriterion, RANKING_CRITERIA } from '../../src/core/scoring/criteria.ts';
import { searchRankBy } from '../../src/core/search/report.ts';

function ranking(values: Record<string, number>, direction: 'smaller' | 'larger' = 'smaller') {
  return rankModels(Object.entries(values).map(([name, value]) => ({ name, value })), { direction, weighted: direction === 'smaller' });
}

const parameters = { 'glaze-only': 3, 'glaze-and-kiln': 6 };
const unscaled = {
  aic: ranking({ 'glaze-only': 120, 'glaze-and-kiln': 110 }),
  aicc: ranking({ 'glaze-only': 121, 'glaze-and-kiln': 112 }),
  bic: ranking({ 'glaze-only': 126, 'glaze-and-kiln': 124 }),
  hqc: ranking({ 'glaze-only': 123, 'glaze-and-kiln': 117 }),
  adjustedR2: ranking({ 'glaze-only': 0.3, 'glaze-and-kiln': 0.4 }, 'larger'),
};

t.test('criteria list: QAIC and QAICc are ranking criteria, ranked like AIC', async (t) => {
  t.same(RANKING_CRITERIA.map((c) => c.name), ['aic', 'aicc', 'bic', 'hqc', 'adjustedR2', 'qaic', 'qaicc']);
  t.ok(isQuasiCriterion('qaic') && isQuasiCriterion('qaicc') && !isQuasiCriterion('aic'));
  // Δ QAIC is read on AIC's scale (Burnham & Anderson 2002), so the Akaike bands word it.
  t.equal(deltaBand(1, 'qaic', DEFAULT_POLICY), 'substantial support');
  t.equal(deltaBand(12, 'qaicc', DEFAULT_POLICY), 'essentially no support');
});

t.test('without QAIC rankings the verdict is as before: no qaic keys, five criteria', async (t) => {
  const v = verdict(unscaled, 'aicc', { parameters });
  t.same(Object.keys(v.best), ['aic', 'aicc', 'bic', 'hqc', 'adjustedR2']);
  t.equal(v.agree, true);
  t.equal(v.summary, 'All five criteria pick "glaze-and-kiln" (6 parameters).');
});

t.test('QAIC rankings count in agree: a model winning only on the plain likelihood does not make the criteria agree', async (t) => {
  const rankings = {
    ...unscaled,
    qaic: ranking({ 'glaze-only': 70, 'glaze-and-kiln': 72 }),
    qaicc: ranking({ 'glaze-only': 71, 'glaze-and-kiln': 75 }),
  };
  const v = verdict(rankings, 'qaicc', { parameters, observations: 60, cHat: 1.8 });
  t.equal(v.agree, false);
  t.equal(v.rankBy, 'qaicc');
  t.equal(v.chosen, 'glaze-only');
  t.equal(v.best.qaic, 'glaze-only');
  t.equal(v.best.aic, 'glaze-and-kiln');
  t.same(v.leanings.map((l) => [l.model, l.criteria]), [['glaze-and-kiln', ['aic', 'aicc', 'bic', 'hqc', 'adjustedR2']], ['glaze-only', ['qaic', 'qaicc']]]);
  // 2ĉ = 3.60 at ĉ = 1.8; ln 60 = 4.09; 2 ln(ln 60) = 2.82.
  t.match(v.summary, /QAIC 2ĉ = 3\.60, QAICc a little over 3\.60 and BIC ln n = 4\.09/);
  t.match(v.summary, /Ranked by QAICc, the criterion this comparison uses, the choice is "glaze-only"\./);

  const all = verdict({ ...unscaled, qaic: unscaled.aic, qaicc: unscaled.aicc }, 'qaic', { parameters });
  t.equal(all.agree, true);
  t.equal(all.summary, 'All seven criteria pick "glaze-and-kiln" (6 parameters).');
});

t.test('rankBy: QAIC from a policy needs a ĉ; AIC/QAIC switch to AICc/QAICc on small samples', async (t) => {
  const qaicPolicy = { ...DEFAULT_POLICY, name: 'kiln-counts', rankBy: 'qaic' as const };
  t.same(chooseRankBy(undefined, qaicPolicy, 80, true), { rankBy: 'qaic', reason: 'the default of policy "kiln-counts"' });
  const small = chooseRankBy(undefined, qaicPolicy, 12.5, true);
  t.equal(small.rankBy, 'qaicc');
  t.equal(small.reason, 'policy "kiln-counts" ranks by QAIC, switched to QAICc because n/k = 12.5 is below 40');
  const noCHat = chooseRankBy(undefined, qaicPolicy, 80, false);
  t.equal(noCHat.rankBy, 'aic');
  t.match(noCHat.reason, /ranks by QAIC, which needs ĉ \(options.overdispersion\); without one the ranking uses AIC, what QAIC is at ĉ = 1$/);
  const noCHatSmall = chooseRankBy(undefined, qaicPolicy, 12.5, false);
  t.equal(noCHatSmall.rankBy, 'aicc');
  t.match(noCHatSmall.reason, /without one the ranking uses AIC, what QAIC is at ĉ = 1, switched to AICc because n\/k = 12.5 is below 40$/);
  // Unchanged for AIC policies (the existing wording).
  const aicPolicy = { ...DEFAULT_POLICY, name: 'p', rankBy: 'aic' as const };
  t.equal(chooseRankBy(undefined, aicPolicy, 10, false).reason, 'policy "p" ranks by AIC, switched to AICc because n/k = 10.0 is below 40');
  t.same(chooseRankBy('qaic', DEFAULT_POLICY, 5, true), { rankBy: 'qaic', reason: 'named by the request' });
});

t.test('a search under a QAIC policy ranks by AIC or AICc: searches have no ĉ and keep their own criteria', async (t) => {
  const policy = { ...DEFAULT_POLICY, name: 'kiln-counts', rankBy: 'qaicc' as const };
  const choice = searchRankBy(undefined, policy, 80);
  t.equal(choice.rankBy, 'aicc');
  t.match(choice.reason, /ranks by QAICc, which needs ĉ/);
});
