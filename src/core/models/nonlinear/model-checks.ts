// The assumption checks of a nonlinear fit in the shape every model reports
// (ModelDiagnostics), read on the standardised residuals √w e as for a
// least-squares fit, with leverages from the Jacobian's hat matrix. The
// multicollinearity check of a design does not carry over: an expression's
// parameters have no design columns to inflate, and the identifiability it
// stands for is checked at the fit (a rank-deficient Jacobian is refused).
import { diagnosticCautions, DIAGNOSTIC_THRESHOLDS as T, NORMALITY_NOTE, TIME_ORDER_NOTE } from '../../diagnostics/index.ts';
import type { ModelDiagnostics } from '../../diagnostics/types.ts';
import type { ModelChecks } from '../scored-model.ts';
import { LEAVE_ONE_OUT_APPROXIMATION, nonlinearLeaveOneOut, nonlinearLeverages, nonlinearResidualChecks } from './capabilities.ts';
import type { NonlinearFit } from './result.ts';

const NOT_A_DESIGN_NOTE =
  'Not assessed for a nonlinear model: its parameters have no design columns whose variance inflation could be measured. Identifiability is checked at the fit (a Jacobian of deficient rank is refused); conditionNumber is that of the Jacobian with unit-length columns.';

export const LINEARISED_LOO_CAUTION = { code: 'loo_linearised', message: LEAVE_ONE_OUT_APPROXIMATION };

/** `rows` maps the fit's rows to the caller's data rows. */
export function nonlinearModelChecks(fit: NonlinearFit, rows: readonly number[]): ModelChecks {
  const n = fit.observations;
  const p = fit.estimates.length;
  const h = nonlinearLeverages(fit);
  const loo = nonlinearLeaveOneOut(fit, h);
  const leverageThreshold = (T.leverageMultiple * p) / n;
  const multicollinearity = {
    varianceInflationFactors: [], maxVarianceInflation: null, varianceInflationThreshold: T.varianceInflation,
    conditionNumber: null, conditionNumberThreshold: T.conditionNumber, uncentredConditionNumber: null, passed: null, note: NOT_A_DESIGN_NOTE,
  };
  let diagnostics: ModelDiagnostics;
  if (fit.exactFit || !(fit.sigma > 0)) {
    const reason = 'The model fits the data exactly, so its residuals carry no information about the errors.';
    diagnostics = {
      available: false, reason,
      residualNormality: { test: 'Jarque–Bera', statistic: null, df: 2, pValue: null, skewness: null, kurtosis: null, alpha: T.alpha, passed: null, note: NORMALITY_NOTE },
      heteroscedasticity: { test: 'Breusch–Pagan (studentised, Koenker)', statistic: null, df: null, pValue: null, alpha: T.alpha, passed: null, note: reason },
      autocorrelation: { test: 'Durbin–Watson', statistic: null, acceptableRange: T.durbinWatsonRange, passed: null, note: TIME_ORDER_NOTE },
      multicollinearity,
      influence: { maxCooksDistance: null, maxCooksDistanceRow: null, cooksDistanceThreshold: T.cooksDistance, leverageThreshold, highLeverageRows: 0, highLeverageRowIndices: [], passed: null },
    };
  } else {
    const c = nonlinearResidualChecks(fit, h);
    let maxCooks: number | null = null;
    let maxRow: number | null = null;
    c.cooksDistances.forEach((d, i) => {
      if (d !== null && (maxCooks === null || d > maxCooks)) { maxCooks = d; maxRow = i; }
    });
    const high: number[] = [];
    h.forEach((v, i) => { if (v > leverageThreshold) high.push(rows[i]); });
    const jb = c.normality;
    const bp = c.heteroscedasticity;
    diagnostics = {
      available: true, reason: null,
      residualNormality: {
        test: 'Jarque–Bera', statistic: jb.statistic, df: 2, pValue: jb.pValue, skewness: jb.skewness, kurtosis: jb.kurtosis, alpha: T.alpha,
        passed: jb.pValue === null ? null : jb.pValue >= T.alpha,
        note: jb.undefinedReason === null ? NORMALITY_NOTE : `${jb.undefinedReason} ${NORMALITY_NOTE}`,
      },
      heteroscedasticity: {
        test: 'Breusch–Pagan (studentised, Koenker)', statistic: bp.statistic, df: bp.df, pValue: bp.pValue, alpha: T.alpha,
        passed: bp.pValue === null ? null : bp.pValue >= T.alpha,
        note: 'The squared residuals are regressed on the fitted values (one degree of freedom): an expression has no regressors of its own.',
      },
      autocorrelation: {
        test: 'Durbin–Watson', statistic: c.durbinWatson, acceptableRange: T.durbinWatsonRange,
        passed: c.durbinWatson >= T.durbinWatsonRange[0] && c.durbinWatson <= T.durbinWatsonRange[1], note: TIME_ORDER_NOTE,
      },
      multicollinearity,
      influence: {
        maxCooksDistance: maxCooks, maxCooksDistanceRow: maxRow === null ? null : rows[maxRow], cooksDistanceThreshold: T.cooksDistance,
        leverageThreshold, highLeverageRows: high.length, highLeverageRowIndices: high,
        passed: (maxCooks === null || maxCooks <= T.cooksDistance) && high.length === 0,
      },
    };
  }
  const cautions = diagnosticCautions(diagnostics).map((message) => ({ code: 'assumption_check', message }));
  if (loo.press !== null) cautions.push(LINEARISED_LOO_CAUTION);
  return {
    press: loo.press,
    looRmse: loo.looRmse,
    looNote: loo.press === null
      ? `Rows ${loo.unitLeverageRows.map((i) => rows[i]).join(', ')} have leverage 1 in the model's tangent plane: leaving one out leaves a parameter undetermined, so the leave-one-out error is undefined.`
      : null,
    diagnostics,
    cautions,
  };
}
