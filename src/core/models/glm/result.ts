// A fitted generalised linear model as the rest of the service reads it:
// coefficients with standard errors √φ √C_jj from C = (X'WX)^-1 of the last
// weighted solve, the deviance family of statistics, and the working state
// the after-ranking statistics use.
import type { DesignMatrix, LeastSquaresFit } from '../../types.ts';
import type { Family } from './families.ts';
import type { Link } from './links.ts';
import type { GlmRows } from './support.ts';
import type { DistributionParameter, GlmCaution, GlmConvergence, GlmFit } from './types.ts';

export interface GlmResultFacts {
  family: Family;
  link: Link;
  design: DesignMatrix;
  rows: GlmRows;
  beta: Float64Array;
  eta: Float64Array;
  mu: Float64Array;
  complement: Float64Array;
  /** The last weighted least-squares solve: its covariance, aliasing and condition number are the model's. */
  solve: LeastSquaresFit;
  /** The IRLS weights that solve used. */
  weights: Float64Array;
  /** √φ, the dispersion's root the standard errors are scaled by (null: no standard errors), and its basis in words. */
  dispersionRoot: number | null;
  dispersionBasis: string;
  parameter: DistributionParameter | null;
  theta: number | null;
  logLikelihood: number | null;
  deviance: number;
  nullDeviance: number | null;
  convergence: GlmConvergence;
  cautions: GlmCaution[];
}

/** Σ prior (y - μ)² / V(μ) on the mean scale. */
export function pearsonChiSquare(family: Family, rows: GlmRows, mu: ArrayLike<number>, complement: ArrayLike<number>, theta: number): number {
  let s = 0;
  for (let i = 0; i < rows.y.length; i++) {
    const r = family.residual(rows.y[i], rows.prior[i], mu[i], complement[i]);
    s += (rows.prior[i] * r * r) / family.variance(mu[i], complement[i], theta);
  }
  return s;
}

function aliasedCaution(aliased: string[], k: number, extra: boolean): GlmCaution {
  const one = aliased.length === 1;
  return {
    code: 'aliased_columns',
    message: `${aliased.map((l) => JSON.stringify(l)).join(', ')} ${one ? 'is a linear combination' : 'are linear combinations'} of earlier columns and cannot be estimated; ${one ? 'its estimate is' : 'their estimates are'} null and the parameter count k = ${k} counts only the estimable coefficients${extra ? ' plus the distribution parameter' : ''}.`,
  };
}

export function buildGlmFit(f: GlmResultFacts): GlmFit {
  const { design, rows, solve } = f;
  const n = design.rows;
  const estimable = new Set(solve.estimable);
  const position = new Map(solve.estimable.map((j, k) => [j, k]));
  const root = f.dispersionRoot;
  const coefficients = design.labels.map((term, j) => {
    if (!estimable.has(j)) return { term, estimate: null, standardError: null };
    const k = position.get(j)!;
    const se = root === null ? null : root * Math.sqrt(solve.unscaledCovariance[k][k]);
    return { term, estimate: f.beta[j], standardError: se !== null && Number.isFinite(se) ? se : null };
  });
  const phi = root === null ? Number.NaN : root * root;
  const covariance = {
    terms: solve.estimable.map((j) => design.labels[j]),
    matrix: solve.unscaledCovariance.map((row) => row.map((c) => phi * c)),
  };
  const rank = solve.rank;
  const parameters = rank + (f.family.parameter ? 1 : 0);
  const theta = f.theta ?? Number.NaN;
  const aliased = design.labels.filter((_, j) => !estimable.has(j));
  const cautions = [...f.cautions];
  if (aliased.length > 0) cautions.push(aliasedCaution(aliased, parameters, f.family.parameter !== null));

  // The working regression at convergence: z - offset = X β + r, r = (y - μ)/(dμ/dη).
  const residuals = new Float64Array(n);
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    fitted[i] = f.eta[i] - (rows.offset ? rows.offset[i] : 0);
    residuals[i] = f.family.residual(rows.y[i], rows.prior[i], f.mu[i], f.complement[i]) / f.link.derivative(f.eta[i]);
  }
  const working: LeastSquaresFit = {
    ...solve,
    coefficients: design.labels.map((_, j) => (estimable.has(j) ? f.beta[j] : null)),
    standardErrors: coefficients.map((c) => c.standardError),
    sigma: root,
    residuals,
    fitted,
  };
  const nullDeviance = f.nullDeviance;
  return {
    ok: true,
    family: f.family.name,
    link: f.link.name,
    measure: f.family.measure,
    observations: n,
    parameters,
    rank,
    logLikelihood: f.logLikelihood,
    deviance: f.deviance,
    nullDeviance,
    devianceExplained: nullDeviance !== null && nullDeviance > 0 ? 1 - f.deviance / nullDeviance : null,
    pearsonChiSquare: pearsonChiSquare(f.family, rows, f.mu, f.complement, theta),
    residualDf: n - rank,
    coefficients,
    aliased,
    covariance,
    dispersion: { value: phi, basis: f.dispersionBasis },
    distributionParameters: f.parameter ? [f.parameter] : [],
    convergence: f.convergence,
    conditionNumber: Number.isFinite(solve.conditionNumber) ? solve.conditionNumber : null,
    fitted: f.mu,
    linearPredictor: f.eta,
    cautions,
    working: {
      fit: working,
      weights: f.weights,
      y: rows.y,
      prior: rows.prior,
      offset: rows.offset,
      theta: f.theta,
    },
  };
}
