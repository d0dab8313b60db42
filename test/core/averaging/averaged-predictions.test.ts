import t from 'tap';
import { averagePredictions } from '../../../src/core/averaging/index.ts';
import { responseScale } from '../../../src/core/inference/back-transform.ts';
import { predictionWithIntervals, type ScaledPrediction } from '../../../src/core/inference/prediction-intervals.ts';
import { tQuantile } from '../../../src/core/inference/distributions.ts';

const close = (a: number | null, b: number, tol = 1e-12) => a !== null && Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));
const identity = responseScale(null);
const at = (location: number, standardError: number, newObservationError = 2 * standardError, df = 20): ScaledPrediction =>
  ({ location, standardError, newObservationError, df, scale: identity });

t.test('estimate and unconditional standard error: the hand computation', async (t) => {
  // Weights 0.5, 0.3, 0.2; predictions 10, 11, 13 with se 1, 2, 1 (by hand):
  //   ybar = 5 + 3.3 + 2.6 = 10.9
  //   eq. 6.12: 0.5(1 + 0.81) + 0.3(4 + 0.01) + 0.2(1 + 4.41) = 3.19
  const models = [[10, 1], [11, 2], [13, 1]].map(([m, s], k) => ({ name: `m${k}`, weight: [0.5, 0.3, 0.2][k] * 7, predictions: [at(m, s)] }));
  const { predictions, issues } = averagePredictions(models, 0.95);
  t.same(issues, []);
  t.ok(close(predictions[0].estimate, 10.9));
  t.ok(close(predictions[0].standardError, Math.sqrt(3.19)));
  // The averaged bound lies between the smallest and the largest of the models' own bounds.
  const q = tQuantile(0.975, 20);
  const ownLowers = [[10, 1], [11, 2], [13, 1]].map(([m, s]) => m - q * s);
  t.ok(predictions[0].lower! > Math.min(...ownLowers) && predictions[0].lower! < Math.max(...ownLowers), `${predictions[0].lower}`);
});

t.test('one model: the MATA bounds are that model\'s own interval exactly', async (t) => {
  const p = at(4.2, 0.3, 0.9, 12);
  const { predictions } = averagePredictions([{ name: 'only', weight: 1, predictions: [p] }], 0.9);
  const q = tQuantile(0.95, 12); // common practice: μ̂ ± t_{0.95,12} · se for a 90% interval
  t.ok(close(predictions[0].lower, 4.2 - q * 0.3, 1e-13), `${predictions[0].lower}`);
  t.ok(close(predictions[0].upper, 4.2 + q * 0.3, 1e-13));
  t.ok(close(predictions[0].predictionLower, 4.2 - q * 0.9, 1e-13));
  t.ok(close(predictions[0].predictionUpper, 4.2 + q * 0.9, 1e-13));
});

t.test('a model of log y keeps its asymmetric interval; two equal models average to it', async (t) => {
  const log = responseScale({ fn: 'log' });
  const p: ScaledPrediction = { location: Math.log(8), standardError: 0.1, newObservationError: 0.3, df: 25, scale: log };
  const own = predictionWithIntervals(p, tQuantile(0.975, 25));
  // Back-transformed: the median exp(μ̂) and exp of the log-scale ends (common practice).
  t.ok(close(own.estimate, 8, 1e-14));
  t.ok(close(own.lower, Math.exp(Math.log(8) - tQuantile(0.975, 25) * 0.1), 1e-14));
  t.ok(close(own.standardError, 8 * 0.1, 1e-14), 'delta method exp(μ̂)·se');
  const twice = averagePredictions([{ name: 'a', weight: 1, predictions: [p] }, { name: 'b', weight: 3, predictions: [p] }], 0.95).predictions[0];
  for (const k of ['estimate', 'lower', 'upper', 'predictionLower', 'predictionUpper'] as const) t.ok(close(twice[k], own[k] as number, 1e-12), k);
});

t.test('a model that cannot predict a row makes the averaged row null, with a note', async (t) => {
  const blank: ScaledPrediction = { location: null, standardError: null, newObservationError: null, df: 10, scale: identity };
  const out = averagePredictions([{ name: 'a', weight: 1, predictions: [at(1, 1), at(2, 1)] }, { name: 'b', weight: 1, predictions: [at(1, 1), blank] }], 0.95);
  t.ok(out.predictions[0].estimate !== null);
  t.equal(out.predictions[1].estimate, null);
  t.same(out.issues.map((i) => i.code), ['averaging-prediction-missing']);
  // Weight 0 takes no part.
  const zero = averagePredictions([{ name: 'a', weight: 1, predictions: [at(1, 1)] }, { name: 'b', weight: 0, predictions: [blank] }], 0.95);
  t.ok(close(zero.predictions[0].estimate, 1));
});

t.test('back-transforms outside the response\'s range: sqrt and Box–Cox', async (t) => {
  const sqrt = responseScale({ fn: 'sqrt' });
  t.equal(sqrt.fromModel(-0.5), 'below');
  t.equal(sqrt.fromModel(3), 9);
  const below = predictionWithIntervals({ location: 0.2, standardError: 0.5, newObservationError: 1, df: 30, scale: sqrt }, tQuantile(0.975, 30));
  t.equal(below.lower, 0, 'an interval end below the range of √y is y = 0');
  t.ok(close(below.estimate, 0.04, 1e-14));
  const negative = responseScale({ fn: 'boxcox', lambda: -0.5 });
  // g(y) = (y^λ − 1)/λ < −1/λ = 2 for every y > 0: a prediction at 2 or above has no y.
  t.equal(negative.fromModel(2.5), 'above');
  t.ok(close(negative.fromModel(1) as number, (1 - 0.5) ** (1 / -0.5), 1e-14), '(1 + λμ)^(1/λ)');
  t.ok(close(negative.toModel(4), (4 ** -0.5 - 1) / -0.5, 1e-14));
  const none = predictionWithIntervals({ location: 2.5, standardError: 0.1, newObservationError: 0.2, df: 30, scale: negative }, 2);
  t.equal(none.estimate, null);
});
