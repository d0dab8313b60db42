// The null deviance: the deviance of the intercept-only model with the same
// offset, fitted (with θ held at the model's θ for the negative binomial), or
// of the offset-only model η = offset when the model has no intercept — the
// model nested in every candidate, as R's glm takes it. Without an offset the
// intercept-only maximum is the weighted mean response whatever the link, so
// no iteration is needed.
import type { DesignMatrix } from '../../types.ts';
import { INTERCEPT_LABEL } from '../../design/index.ts';
import { runIrls, type IrlsProblem } from './irls.ts';

function interceptOnly(rows: number): DesignMatrix {
  return {
    rows,
    labels: [INTERCEPT_LABEL],
    high: [new Float64Array(rows).fill(1)],
    low: [new Float64Array(rows)],
    intercept: true,
    termOfColumn: [-1],
  };
}

function devianceAtMeans(pr: IrlsProblem, eta: (i: number) => number): number | null {
  let total = 0;
  for (let i = 0; i < pr.y.length; i++) {
    const e = eta(i);
    const mu = pr.link.mean(e);
    const c = pr.link.complement(e);
    if (!pr.link.validEta(e) || !pr.family.validMean(mu, c)) return null;
    total += pr.family.deviance(pr.y[i], pr.prior[i], mu, c, pr.theta);
  }
  return Number.isFinite(total) ? total : null;
}

export function nullDeviance(pr: IrlsProblem, hasIntercept: boolean, maxIterations: number): number | null {
  const n = pr.y.length;
  if (!hasIntercept) return devianceAtMeans(pr, (i) => (pr.offset ? pr.offset[i] : 0));
  if (!pr.offset) {
    let total = 0;
    let weight = 0;
    for (let i = 0; i < n; i++) {
      total += pr.family.name === 'binomial' ? pr.y[i] : pr.prior[i] * pr.y[i];
      weight += pr.prior[i];
    }
    const eta = pr.link.link(total / weight);
    return devianceAtMeans(pr, () => eta);
  }
  const outcome = runIrls({ ...pr, design: interceptOnly(n) }, { maxIterations, start: null, finalStep: false });
  return outcome.ok && outcome.converged ? outcome.point.deviance : null;
}
