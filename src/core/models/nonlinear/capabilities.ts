// The statistics after the ranking, for a fitted nonlinear candidate: the
// leverages of the Jacobian's hat matrix, the linearised leave-one-out error,
// residual checks, and mean-response predictions at new rows with
// delta-method standard errors. Everything here linearises the model at the
// estimates (Bates & Watts 1988, ch. 2 and 4; Cook & Weisberg 1982, ch. 5 for
// the hat matrix of a nonlinear fit): exact for a linear model, an
// approximation whose quality the curvature of the model decides.
import type { StatisticsIssue } from '../../inference/issue.ts';
import { UNIT_LEVERAGE_TOLERANCE } from '../../loo.ts';
import { breuschPaganKoenker, durbinWatson, jarqueBera } from '../../diagnostics/residual-tests.ts';
import { cooksDistances } from '../../diagnostics/influence.ts';
import type { NonlinearCandidate } from './candidate.ts';
import { tCriticalValue } from './coefficient-table.ts';
import { varianceFactor } from './covariance.ts';
import { TapeEvaluator } from './expression/evaluate.ts';
import type { NonlinearFit } from './result.ts';

/** h_i = sqrt(w_i) j_i' (J'WJ)^-1 j_i sqrt(w_i), j_i the gradient of the model at row i. */
export function nonlinearLeverages(fit: NonlinearFit): Float64Array {
  const n = fit.observations;
  const p = fit.estimates.length;
  const row = new Float64Array(p);
  const h = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < p; j++) row[j] = fit.jacobian[j * n + i];
    h[i] = varianceFactor(fit.factor, row);
  }
  return h;
}

export interface LinearisedLeaveOneOut {
  /** Σ w (e/(1 - h))²; null when some row has leverage 1. */
  press: number | null;
  /** sqrt(press / Σ w), in units of the response (on the candidate's scale). */
  looRmse: number | null;
  leverages: Float64Array;
  unitLeverageRows: number[];
  /** Says that this is the linearised approximation, not a refit without each row. */
  approximation: string;
}

export const LEAVE_ONE_OUT_APPROXIMATION =
  'Linearised leave-one-out: e_i / (1 - h_ii) with h_ii from the Jacobian at the estimates, the exact identity of a linear model applied to the model\'s tangent plane; a refit without row i can differ when the model is strongly curved near the estimates.';

export function nonlinearLeaveOneOut(fit: NonlinearFit, leverages = nonlinearLeverages(fit)): LinearisedLeaveOneOut {
  const unitLeverageRows: number[] = [];
  let press = 0;
  let weightTotal = 0;
  for (let i = 0; i < fit.observations; i++) {
    const w = fit.weights ? fit.weights[i] : 1;
    weightTotal += w;
    const complement = 1 - leverages[i];
    if (complement < UNIT_LEVERAGE_TOLERANCE) {
      unitLeverageRows.push(i);
      continue;
    }
    const e = fit.residuals[i] / complement;
    press += w * e * e;
  }
  const defined = unitLeverageRows.length === 0;
  return {
    press: defined ? press : null,
    looRmse: defined ? Math.sqrt(press / weightTotal) : null,
    leverages,
    unitLeverageRows,
    approximation: LEAVE_ONE_OUT_APPROXIMATION,
  };
}

export interface NonlinearResidualChecks {
  normality: ReturnType<typeof jarqueBera>;
  /** Koenker's studentised score test of e² against the fitted values (df 1). */
  heteroscedasticity: ReturnType<typeof breuschPaganKoenker>;
  durbinWatson: number;
  cooksDistances: (number | null)[];
}

/** Checks on the standardised residuals sqrt(w) e, as for a linear fit. */
export function nonlinearResidualChecks(fit: NonlinearFit, leverages = nonlinearLeverages(fit)): NonlinearResidualChecks {
  const w = fit.weights;
  const standardised = fit.residuals.map((e, i) => (w ? Math.sqrt(w[i]) : 1) * e);
  return {
    normality: jarqueBera(standardised),
    heteroscedasticity: breuschPaganKoenker(standardised, [fit.fitted]),
    durbinWatson: durbinWatson(standardised),
    cooksDistances: cooksDistances(fit.residuals, leverages, fit.estimates.length, fit.sigma, w ?? undefined),
  };
}

export interface NonlinearPrediction {
  estimate: number | null;
  /** Delta-method standard error of the estimated mean: s sqrt(g' (J'WJ)^-1 g), g = d f / d b at the row. */
  standardError: number | null;
  lower: number | null;
  upper: number | null;
}

/**
 * The mean response at `rows` new rows (on the candidate's scale), `columns`
 * holding the values of candidate.columns there. A row where the expression
 * or its gradient has no finite value gets nulls and an issue.
 */
export function predictNonlinear(
  fit: NonlinearFit,
  candidate: NonlinearCandidate,
  columns: readonly Float64Array[],
  rows: number,
  level = fit.intervalLevel,
): { predictions: NonlinearPrediction[]; issues: StatisticsIssue[] } {
  const m = rows;
  const p = fit.estimates.length;
  const values = new Float64Array(m);
  const gradient = new Float64Array(m * p);
  new TapeEvaluator(candidate.tape, columns, m).valuesAndJacobian(fit.estimates, values, gradient);
  const critical = tCriticalValue(level, fit.residualDf);
  const g = new Float64Array(p);
  const undefinedRows: number[] = [];
  const predictions = Array.from({ length: m }, (_, i): NonlinearPrediction => {
    for (let j = 0; j < p; j++) g[j] = gradient[j * m + i];
    const estimate = values[i];
    if (!Number.isFinite(estimate) || !g.every(Number.isFinite)) {
      undefinedRows.push(i);
      return { estimate: null, standardError: null, lower: null, upper: null };
    }
    const se = fit.sigma * Math.sqrt(varianceFactor(fit.factor, g));
    return { estimate, standardError: se, lower: estimate - critical * se, upper: estimate + critical * se };
  });
  const issues: StatisticsIssue[] = undefinedRows.length === 0 ? [] : [{
    code: 'prediction-not-finite',
    message: `The expression of "${fit.name}" or its derivatives have no finite value at some prediction rows, so nothing can be predicted there.`,
    facts: { rows: undefinedRows.join(', ') },
  }];
  return { predictions, issues };
}
