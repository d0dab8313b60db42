// Plain-words cautions for failed assumption checks. AIC, AICc, BIC, HQC and
// the nested tests all rest on the Gaussian likelihood of independent,
// identically distributed normal errors; each caution says what breaking
// that assumption does to them and what to look at next.
// The closing reminder that checks do not validate a model is said once per
// comparison (scoring/cautions.ts), not once per model.
import type { ModelDiagnostics } from './types.ts';

export function diagnosticCautions(d: ModelDiagnostics): string[] {
  const out: string[] = [];
  const n = d.residualNormality;
  if (n.passed === false) {
    out.push(
      `The residuals do not look normally distributed (Jarque–Bera p = ${fmt(n.pValue)}). The criteria use a normal likelihood, so their values and the p-values of the nested tests are approximate; ` +
        'look for outliers, a skewed response (a log or square-root response may help) or a missing term.',
    );
  }
  const h = d.heteroscedasticity;
  if (h.passed === false) {
    out.push(
      `The spread of the residuals changes with the regressors (Breusch–Pagan p = ${fmt(h.pValue)}). The criteria assume one error variance for every row, so rows with large variance weigh too much in the comparison; ` +
        'consider weights, a transformed response, or modelling the variance.',
    );
  }
  const a = d.autocorrelation;
  if (a.passed === false) {
    out.push(
      `Neighbouring residuals are correlated (Durbin–Watson d = ${fmt(a.statistic)}, outside ${a.acceptableRange[0]}–${a.acceptableRange[1]}). If the rows are in time order, the errors are not independent: the criteria then overstate how much information the data hold and favour larger models; ` +
        'consider a model for the correlation or a time term. If the row order means nothing, ignore this check.',
    );
  }
  const m = d.multicollinearity;
  if (m.passed === false) {
    out.push(
      `Some regressors are nearly linear combinations of others (largest variance inflation factor ${fmt(m.maxVarianceInflation)}, condition number of the centred, scaled regressors ${fmt(m.conditionNumber)}). ` +
        'The criteria are not affected, but the individual coefficients and their standard errors are unstable and hard to interpret, and so is term importance in model averaging; consider centring, dropping or combining related terms.' +
        (m.note ? ` ${m.note}` : ''),
    );
  }
  const f = d.influence;
  if (f.passed === false) {
    const parts: string[] = [];
    if (f.maxCooksDistance !== null && f.maxCooksDistance > f.cooksDistanceThreshold) {
      parts.push(`row ${f.maxCooksDistanceRow} has Cook's distance ${fmt(f.maxCooksDistance)}`);
    }
    if (f.highLeverageRows > 0) parts.push(`${f.highLeverageRows} row(s) have leverage above 2p/n = ${fmt(f.leverageThreshold)}`);
    out.push(
      `A few rows carry much of the fit (${parts.join('; ')}). The ranking may change if they are removed or corrected; check those rows for recording errors and compare the ranking without them.`,
    );
  }
  return out;
}

function fmt(x: number | null): string {
  if (x === null) return 'n/a';
  if (x !== 0 && (Math.abs(x) < 1e-3 || Math.abs(x) >= 1e5)) return x.toExponential(2);
  return String(Math.round(x * 1000) / 1000);
}
