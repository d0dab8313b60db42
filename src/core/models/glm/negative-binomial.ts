// The negative binomial by alternation, as MASS::glm.nb does it: a Poisson
// fit for starting means, then θ by maximum likelihood at the current means
// and IRLS at that θ (warm-started from the current coefficients), until θ
// and the log-likelihood stop moving. At fixed θ the steps are Newton's, by
// the observed information (irls-point.ts): the log link is not the negative
// binomial's canonical link, and Fisher scoring alone converges only
// linearly — slowly enough, when θ is small, to run out of steps; the last IRLS run ends on the
// least-squares engine's own solve for the covariance. Every weighted solve
// counts towards one budget of NB_SOLVE_BUDGET × maxIterations, the figure
// the pricing assumes.
import { FAMILIES } from './families.ts';
import { runIrls, type IrlsOptions, type IrlsOutcome, type IrlsProblem } from './irls.ts';
import { familyLogLikelihood } from './log-likelihood.ts';
import { momentTheta, thetaMaximumLikelihood, thetaStandardError } from './theta.ts';
import type { ParameterEstimate } from './dispersion.ts';

export const NB_SOLVE_BUDGET = 4;
export const NB_MAX_ALTERNATIONS = 25;
const THETA_TOLERANCE = 1e-11;
const LIKELIHOOD_TOLERANCE = 1e-12;

export type NegativeBinomialOutcome =
  | { ok: true; outcome: Extract<IrlsOutcome, { ok: true }>; theta: ParameterEstimate; alternations: number }
  | { ok: false; outcome: IrlsOutcome }
  | { ok: false; unbounded: number; outcome: Extract<IrlsOutcome, { ok: true }> };

export function fitNegativeBinomial(pr: IrlsProblem, options: Omit<IrlsOptions, 'finalStep'>): NegativeBinomialOutcome {
  const budget = NB_SOLVE_BUDGET * options.maxIterations;
  let used = 0;
  let halvings = 0;
  const run = (problem: IrlsProblem, start: Float64Array | null, finalStep: boolean) => {
    const outcome = runIrls(problem, { maxIterations: Math.max(1, Math.min(options.maxIterations, budget - used)), start, finalStep });
    if (outcome.ok) {
      used += outcome.iterations;
      halvings += outcome.stepHalvings;
    }
    return outcome;
  };
  const tally = (o: Extract<IrlsOutcome, { ok: true }>) => ({ ...o, iterations: used, stepHalvings: halvings });

  let current = run({ ...pr, family: FAMILIES.poisson }, options.start, false);
  if (!current.ok || !current.converged) return { ok: false, outcome: current.ok ? tally(current) : current };
  let estimate = thetaMaximumLikelihood(pr.y, current.point.mu, momentTheta(pr.y, current.point.mu));
  if (!estimate.ok) return { ok: false, unbounded: estimate.unbounded, outcome: tally(current) };
  let theta = estimate.estimate;
  let logL = Number.NaN;
  let alternations = 0;
  let settled = false;
  while (alternations < NB_MAX_ALTERNATIONS && used < budget) {
    alternations++;
    current = run({ ...pr, theta, observedInformation: true }, current.point.beta, false);
    if (!current.ok || !current.converged) return { ok: false, outcome: current.ok ? tally(current) : current };
    estimate = thetaMaximumLikelihood(pr.y, current.point.mu, theta);
    if (!estimate.ok) return { ok: false, unbounded: estimate.unbounded, outcome: tally(current) };
    const next = estimate.estimate;
    const nextLogL = familyLogLikelihood('negativeBinomial', { y: pr.y, prior: null, mu: current.point.mu }, next) ?? Number.NaN;
    settled = Math.abs(next - theta) <= THETA_TOLERANCE * theta
      && Math.abs(nextLogL - logL) <= LIKELIHOOD_TOLERANCE * (Math.abs(nextLogL) + 0.1);
    theta = next;
    logL = nextLogL;
    if (settled) break;
  }
  if (!settled) return { ok: false, outcome: { ...tally(current), converged: false } };
  const last = run({ ...pr, theta, observedInformation: true }, current.point.beta, true);
  if (!last.ok || !last.converged) return { ok: false, outcome: last.ok ? tally(last) : last };
  return {
    ok: true,
    outcome: tally(last),
    theta: { estimate: theta, standardError: thetaStandardError(pr.y, last.point.mu, theta) },
    alternations,
  };
}
