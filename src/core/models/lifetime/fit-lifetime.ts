// One lifetime candidate fitted by maximum likelihood: checks that the data
// can carry the distribution, finds the estimable design columns and starting
// values by least squares, runs Newton–Raphson in standardised coordinates,
// and maps the estimates and their covariance back to the data's scale.
import type { DesignMatrix } from '../../types.ts';
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import { fitLeastSquares } from '../../fit/index.ts';
import { censoringCounts, firstNonPositiveTime, type CensoredResponse } from './censoring.ts';
import { DISTRIBUTION_NAMES, DISTRIBUTIONS, isDistributionName, type Distribution } from './distributions.ts';
import { modelScaleBounds, standardiseBounds } from './bounds.ts';
import { locationScaleLogLikelihood } from './location-scale-likelihood.ts';
import { gammaLogLikelihood } from './gamma-likelihood.ts';
import { aftObjective, type Contributions } from './aft-objective.ts';
import { maximiseByNewton, type NewtonOutcome } from './newton.ts';
import { backTransform, standardiseDesign, type ResponseScaling } from './standardised-problem.ts';
import { startingValues } from './start-values.ts';
import { choleskyInverse, congruence } from './small-matrix.ts';
import { checkLifetimeOptions, DEFAULT_MAX_ITERATIONS, type LifetimeOptions } from './options.ts';
import { lifetimeResult, type LifetimeFit } from './lifetime-result.ts';

export interface LifetimeCandidate {
  name: string;
  /** One of DISTRIBUTION_NAMES; anything else is an issue. */
  distribution: string;
  /** The location's design on the response rows (buildDesign with an intercept). */
  design: DesignMatrix;
}

/** Below this log scale (in units of the data's spread) the scale has collapsed: σ' < 6e-6, far below any real scatter of lives. */
const COLLAPSED_LOG_SCALE = -12;
/** Beyond this size a standardised coefficient (spreads of y per spread of x) is running away. */
const DIVERGED_COEFFICIENT = 30;
/**
 * A standardised standard error above this means the data do not bound the
 * coefficient: the likelihood flattens as it grows (e.g. a factor level
 * whose units all outlived the test), so Newton's decrement vanishes before
 * any maximum. Real data pin a standardised coefficient to about
 * 1/sqrt(failures), far below 1.
 */
const UNBOUNDED_STANDARD_ERROR = 1e3;

function contributionsOf(distribution: Distribution): Contributions {
  const form = distribution.form;
  if (form.kind === 'gamma') return gammaLogLikelihood;
  return (bounds, mu, s, out) => locationScaleLogLikelihood(form.law, bounds, mu, s, out);
}

/** The parameters a data set without failures (or without survivors) leaves undetermined. */
function undeterminedParameters(distribution: Distribution, design: DesignMatrix): string[] {
  const onlyIntercept = design.labels.length === 1 && design.intercept;
  const location = onlyIntercept ? distribution.usual.filter((u) => u.from === 'location').map((u) => u.name) : design.labels;
  return [...location, ...distribution.usual.filter((u) => u.from === 'extra').map((u) => u.name)];
}

function dataIssues(distribution: Distribution, design: DesignMatrix, response: CensoredResponse, at: IssuePath): Issue[] {
  if (distribution.scale === 'log') {
    const bad = firstNonPositiveTime(response);
    if (bad) {
      return [issue('lifetime_time_not_positive', [...at, 'distribution'], {
        column: response.timeColumn, row: bad.row, value: bad.value, status: bad.status, distribution: distribution.name,
      })];
    }
  }
  const counts = censoringCounts(response);
  const rows = response.time.length;
  if (counts.right === rows) {
    return [issue('lifetime_no_failures', at, { rows, notEstimable: undeterminedParameters(distribution, design) })];
  }
  if (counts.left === rows) {
    return [issue('lifetime_only_left_censored', at, { rows, notEstimable: undeterminedParameters(distribution, design) })];
  }
  return [];
}

function meanAndSpread(values: Float64Array): ResponseScaling {
  let total = 0;
  let count = 0;
  for (const v of values) if (Number.isFinite(v)) { total += v; count++; }
  const centre = count > 0 ? total / count : 0;
  let square = 0;
  for (const v of values) if (Number.isFinite(v)) square += (v - centre) * (v - centre);
  const spread = count > 0 ? Math.sqrt(square / count) : 0;
  return { centre, spread: spread > 0 && Number.isFinite(spread) ? spread : 1 };
}

export function fitLifetime(
  candidate: LifetimeCandidate,
  response: CensoredResponse,
  options: LifetimeOptions = {},
  at: IssuePath = [],
): LifetimeFit | { issues: Issue[] } {
  if (!isDistributionName(candidate.distribution)) {
    return { issues: [issue('lifetime_distribution_unknown', [...at, 'distribution'], { distribution: String(candidate.distribution), known: [...DISTRIBUTION_NAMES] })] };
  }
  const distribution = DISTRIBUTIONS[candidate.distribution];
  const design = candidate.design;
  const n = response.time.length;
  if (design.rows !== n) {
    return { issues: [issue('observations_mismatch', at, { observations: design.rows, expected: n, against: 'the response has' })] };
  }
  const problems = [...checkLifetimeOptions(options), ...dataIssues(distribution, design, response, at)];
  if (problems.length > 0) return { issues: problems };

  const form = distribution.form;
  const extraFree = !(form.kind === 'locationScale' && form.fixedScale);
  const onScale = modelScaleBounds(response, distribution.scale === 'log');
  const moments = meanAndSpread(onScale.representative);
  // A free scale absorbs the spread; the exponential's (fixed at 1) and the
  // gamma's (a shape, not a scale of ln t) cannot, so only shift those.
  const scaling: ResponseScaling = {
    centre: design.intercept ? moments.centre : 0,
    spread: form.kind === 'locationScale' && !form.fixedScale ? moments.spread : 1,
  };
  const leastSquares = fitLeastSquares(design, onScale.representative);
  const estimable = leastSquares.estimable;
  const standardised = standardiseDesign(design, estimable);
  const objective = aftObjective({
    columns: standardised.columns,
    bounds: standardiseBounds(onScale.bounds, scaling.centre, scaling.spread),
    contributions: contributionsOf(distribution),
    extraFree,
    fixedExtra: 0,
  });
  const cap = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const lsCoefficients = estimable.map((j) => leastSquares.coefficients[j] as number);
  const rootMeanSquare = Math.sqrt(leastSquares.rss / n);
  // A second start (the location without its terms) when the first fails:
  // heavy censoring can put least squares far from the maximum.
  let outcome: NewtonOutcome | null = null;
  let iterations = 0;
  for (const withSlopes of [true, false]) {
    outcome = maximiseByNewton(objective, startingValues(distribution, lsCoefficients, rootMeanSquare, standardised, scaling, withSlopes), cap);
    iterations += outcome.iterations;
    if (outcome.converged) break;
  }
  const result = outcome!;
  const p = standardised.columns.length;
  const m = p + (extraFree ? 1 : 0);
  const collapsed = extraFree && form.kind === 'locationScale' && result.theta[p] < COLLAPSED_LOG_SCALE;
  const fitCovariance = result.information ? choleskyInverse(result.information, m) : null;
  const unbounded = fitCovariance !== null && Array.from({ length: p }, (_, j) => fitCovariance[j * m + j])
    .some((v) => !(v <= UNBOUNDED_STANDARD_ERROR * UNBOUNDED_STANDARD_ERROR));
  if (!result.converged || collapsed || unbounded) {
    const diverged = unbounded || result.theta.slice(0, p).some((g) => Math.abs(g) > DIVERGED_COEFFICIENT);
    const reason = collapsed ? 'scale_collapsed' : diverged ? 'estimates_diverge' : result.reason ?? 'estimates_diverge';
    return {
      issues: [issue('lifetime_not_converged', at, { name: candidate.name, distribution: distribution.name, iterations, reason })],
    };
  }
  const map = backTransform(standardised, scaling, extraFree);
  const theta = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let v = map.offset[i];
    for (let j = 0; j < m; j++) v += map.jacobian[i * m + j] * result.theta[j];
    theta[i] = v;
  }
  const covariance = congruence(map.jacobian, m, m, fitCovariance!);
  // The fit's log-likelihood is of y' = (y - centre)/spread: each exact row's
  // density gains -ln spread on the scale of y, and -ln t more on the time scale.
  const logLikelihoodOfY = result.at.value - onScale.exactCount * Math.log(scaling.spread);
  return lifetimeResult({
    name: candidate.name,
    distribution,
    design,
    leastSquares,
    estimates: {
      distribution: distribution.name,
      estimable,
      coefficients: theta.slice(0, p),
      extra: extraFree ? theta[p] : null,
      covariance,
      dimension: m,
    },
    logLikelihood: logLikelihoodOfY - onScale.sumLogExactTimes,
    logLikelihoodLogTime: distribution.scale === 'log' ? logLikelihoodOfY : null,
    convergence: { iterations, decrement: result.decrement },
    counts: censoringCounts(response),
    options,
  });
}
