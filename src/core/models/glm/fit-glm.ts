// One generalised linear model fitted here: link and data checks, then the
// Gaussian identity model by least squares itself (the same solve, the same
// numbers as a linear candidate), every other model by IRLS (the negative
// binomial alternating with θ), then separation and convergence checks,
// the distribution parameter by maximum likelihood and the full
// log-likelihood.
import type { DesignMatrix } from '../../types.ts';
import { issue, type Issue, type IssuePath } from '../../issues.ts';
import { fitLeastSquares } from '../../fit/index.ts';
import { gaussianLogLikelihood, sumOfLogs } from '../../likelihood.ts';
import { FAMILIES, resolveLink, type Family } from './families.ts';
import { LINKS } from './links.ts';
import { checkGlmData, type GlmDataInput, type GlmFieldPaths, type GlmRows } from './support.ts';
import { CONVERGENCE_RULE, DEFAULT_MAX_ITERATIONS, runIrls, type IrlsOutcome, type IrlsProblem } from './irls.ts';
import { fitNegativeBinomial } from './negative-binomial.ts';
import { canSeparate, findSeparation } from './separation.ts';
import { nullDeviance } from './null-model.ts';
import { closedFormDispersion, gammaShape, type ParameterEstimate } from './dispersion.ts';
import { familyLogLikelihood } from './log-likelihood.ts';
import { buildGlmFit } from './result.ts';
import { interceptColumn } from './design-facts.ts';
import type { DistributionParameter, GlmCaution, GlmFamilyName, GlmFit, GlmLinkName } from './types.ts';

export interface GlmInput extends GlmDataInput {
  family: GlmFamilyName;
  /** Default: the family's canonical link. */
  link?: GlmLinkName;
  design: DesignMatrix;
  /** Warm start: coefficients by design label (e.g. a search's parent model); columns not named start at 0. */
  start?: ReadonlyMap<string, number>;
  /** Cap on weighted solves (default 25); a negative binomial may use NB_SOLVE_BUDGET times as many. */
  maxIterations?: number;
  /** Where the candidate sits in the request, e.g. ['candidates', 2]. */
  at?: IssuePath;
  paths?: Partial<GlmFieldPaths>;
}

export type GlmOutcome = GlmFit | { issues: Issue[] };

const DISPERSION_BASIS = {
  one: 'fixed at 1 (the family has no dispersion)',
  leastSquares: 'RSS / (n - rank), as least squares (the Gaussian family)',
  maximumLikelihood: 'the maximum-likelihood dispersion (1/shape for the gamma)',
} as const;

function fieldPaths(input: GlmInput): GlmFieldPaths {
  const at = input.at ?? [];
  return {
    candidate: at,
    response: ['response'],
    trials: ['trials'],
    offset: [...at, 'offset'],
    weights: ['weights'],
    ...input.paths,
  };
}

function startVector(design: DesignMatrix, start: ReadonlyMap<string, number> | undefined): Float64Array | null {
  if (!start) return null;
  return Float64Array.from(design.labels, (label) => {
    const b = start.get(label);
    return b !== undefined && Number.isFinite(b) ? b : 0;
  });
}

export function fitGlm(input: GlmInput): GlmOutcome {
  const paths = fieldPaths(input);
  const family = FAMILIES[input.family];
  const linkName = resolveLink(input.family, input.link);
  if (!linkName) {
    return { issues: [issue('glm_link_not_allowed', [...paths.candidate, 'link'], { family: input.family, link: String(input.link), allowed: [...family.links] })] };
  }
  const checked = checkGlmData(input.family, input, paths);
  if ('issues' in checked) return checked;
  const { design } = input;
  if (design.rows < design.labels.length) {
    return { issues: [issue('too_few_rows', paths.candidate, { rows: design.rows, parameters: design.labels.length })] };
  }
  if (input.family === 'gaussian' && linkName === 'identity') return gaussianIdentity(design, checked.rows, input.weights ?? null);
  return iterativeFit(input, family, linkName, checked.rows, paths);
}

/** The Gaussian identity model is least squares: one solve, the least-squares numbers bit for bit. */
function gaussianIdentity(design: DesignMatrix, rows: GlmRows, weights: Float64Array | null): GlmOutcome {
  const y = rows.offset ? Float64Array.from(rows.y, (v, i) => v - rows.offset![i]) : rows.y;
  const solve = fitLeastSquares(design, y, weights ?? undefined);
  const n = design.rows;
  const eta = Float64Array.from(solve.fitted, (f, i) => f + (rows.offset ? rows.offset[i] : 0));
  const cautions: GlmCaution[] = [];
  const ml = closedFormDispersion(solve.rss, n);
  if (solve.exactFit) {
    cautions.push({
      code: 'exact_fit',
      message: 'The model reproduces the response exactly (residuals at rounding level), so its Gaussian log-likelihood is unbounded and is null. Coefficients are still reported.',
    });
  }
  return buildGlmFit({
    family: FAMILIES.gaussian,
    link: LINKS.identity,
    design,
    rows,
    beta: Float64Array.from(solve.coefficients, (b) => b ?? 0),
    eta,
    mu: eta,
    complement: Float64Array.from(eta, (m) => 1 - m),
    solve,
    weights: weights ?? new Float64Array(n).fill(1),
    dispersionRoot: solve.sigma,
    dispersionBasis: DISPERSION_BASIS.leastSquares,
    parameter: ml ? { name: 'dispersion', ...ml } : null,
    theta: null,
    logLikelihood: solve.exactFit ? null : gaussianLogLikelihood({ n, rss: solve.rss, sumLogWeights: weights ? sumOfLogs(weights) : 0 }),
    deviance: solve.rss,
    nullDeviance: solve.tss,
    convergence: { converged: true, iterations: 1, stepHalvings: 0, rule: 'closed form: one least-squares solve (no iteration)' },
    cautions,
  });
}

function iterativeFit(input: GlmInput, family: Family, linkName: GlmLinkName, rows: GlmRows, paths: GlmFieldPaths): GlmOutcome {
  const { design } = input;
  const link = LINKS[linkName];
  const at = paths.candidate;
  const maxIterations = input.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const problem: IrlsProblem = { design, family, link, y: rows.y, prior: rows.prior, offset: rows.offset, theta: Number.NaN };
  const start = startVector(design, input.start);

  let outcome: IrlsOutcome;
  let theta: ParameterEstimate | null = null;
  let unbounded: number | null = null;
  if (family.name === 'negativeBinomial') {
    const nb = fitNegativeBinomial(problem, { maxIterations, start });
    outcome = nb.outcome;
    if (nb.ok) theta = nb.theta;
    else if ('unbounded' in nb) unbounded = nb.unbounded;
  } else {
    outcome = runIrls(problem, { maxIterations, start, finalStep: true });
  }
  // Separation first: a likelihood rising towards a bound also ends IRLS at
  // the cap or at the edge of the doubles (1 - μ underflowing), not only by the rule.
  const step = outcome.ok ? outcome.lastStep : outcome.failure === 'step_outside_domain' ? outcome.lastStep : null;
  if (canSeparate(family.name, linkName)) {
    const separated = findSeparation(design, family.name, rows.y, rows.prior, step);
    if (separated) {
      return { issues: [issue('glm_separation', at, { family: family.name, terms: separated.columns.map((j) => design.labels[j]), rows: separated.rows })] };
    }
  }
  if (!outcome.ok) {
    return outcome.failure === 'no_valid_start'
      ? { issues: [issue('glm_no_valid_start', at, { family: family.name, link: linkName })] }
      : { issues: [issue('glm_step_outside_domain', at, { family: family.name, link: linkName, iteration: outcome.iteration })] };
  }
  if (unbounded !== null) return { issues: [issue('glm_theta_unbounded', at, { theta: unbounded })] };
  if (!outcome.converged || !outcome.final) {
    return { issues: [issue('glm_not_converged', at, {
      family: family.name, link: linkName, canonical: linkName === family.canonical, iterations: outcome.iterations, change: outcome.lastChange, step: finite(outcome.lastStepInStandardErrors),
    })] };
  }

  const { point, final } = outcome;
  const n = design.rows;
  const thetaValue = theta ? theta.estimate : null;
  let parameter: DistributionParameter | null = null;
  let root: number | null = 1;
  let basis: string = DISPERSION_BASIS.one;
  if (family.name === 'negativeBinomial') {
    parameter = { name: 'theta', estimate: theta!.estimate, standardError: finite(theta!.standardError) };
  } else if (family.name === 'gamma' || family.name === 'inverseGaussian') {
    const estimate = family.name === 'gamma' ? gammaShape(point.deviance, n) : closedFormDispersion(point.deviance, n);
    if (!estimate) return { issues: [issue('glm_dispersion_degenerate', at, { family: family.name, parameter: family.name === 'gamma' ? 'shape' : 'dispersion' })] };
    parameter = { name: family.name === 'gamma' ? 'shape' : 'dispersion', estimate: estimate.estimate, standardError: finite(estimate.standardError) };
    root = Math.sqrt(family.name === 'gamma' ? 1 / estimate.estimate : estimate.estimate);
    basis = DISPERSION_BASIS.maximumLikelihood;
  } else if (family.name === 'gaussian') {
    const ml = closedFormDispersion(point.deviance, n);
    parameter = ml ? { name: 'dispersion', ...ml } : null;
    const df = n - final.fit.rank;
    root = df > 0 ? Math.sqrt(point.deviance / df) : null;
    basis = DISPERSION_BASIS.leastSquares;
  }
  const likelihoodParameter = family.name === 'gamma' || family.name === 'inverseGaussian' ? parameter!.estimate : thetaValue;
  const logLikelihood = familyLogLikelihood(
    family.name,
    { y: rows.y, prior: family.name === 'binomial' || family.name === 'gaussian' ? rows.prior : null, mu: point.mu, complement: point.complement },
    likelihoodParameter,
  );
  const hasIntercept = interceptColumn(design) >= 0 && final.fit.estimable.includes(interceptColumn(design));
  return buildGlmFit({
    family, link, design, rows,
    beta: point.beta, eta: point.eta, mu: point.mu, complement: point.complement,
    solve: final.fit,
    weights: final.weights,
    dispersionRoot: root,
    dispersionBasis: basis,
    parameter,
    theta: thetaValue,
    logLikelihood,
    deviance: point.deviance,
    nullDeviance: nullDeviance({ ...problem, theta: thetaValue ?? Number.NaN }, hasIntercept, maxIterations),
    convergence: { converged: true, iterations: outcome.iterations, stepHalvings: outcome.stepHalvings, rule: CONVERGENCE_RULE },
    cautions: [],
  });
}

function finite(x: number | null): number | null {
  return x !== null && Number.isFinite(x) ? x : null;
}
