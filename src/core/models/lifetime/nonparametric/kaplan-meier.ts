// The Kaplan–Meier estimate of survival for exact and right-censored
// observations (Kaplan & Meier 1958), a step at each failure time:
// S(t_j) = Π_{i<=j} (1 - d_i/n_i), with n_i the units still at risk just
// before t_i. A unit censored at a failure time counts as at risk at that
// time (common practice: censoring is taken to follow failures at a tie).
// Greenwood's variance, Var ln S = Σ d/(n(n-d)), gives intervals on the
// log(-log S) scale (Kalbfleisch & Prentice 1980; R survival's
// conf.type = "log-log"), which stay inside (0, 1).
import { waldQuantile } from '../life-quantities.ts';

export interface SurvivalStep {
  /** The failure time at which the estimate steps down. */
  time: number;
  atRisk: number;
  failures: number;
  /** The estimate just after the step. */
  survival: number;
  /** Greenwood standard error of the survival estimate; null once survival is 0. */
  standardError: number | null;
  lower: number | null;
  upper: number | null;
}

export interface KaplanMeierEstimate {
  method: 'kaplanMeier';
  steps: SurvivalStep[];
  /** Times of right-censored units, for tick marks. */
  censoredTimes: number[];
  intervalLevel: number;
}

/** `failed[i]` true for an exact failure, false for a right-censored unit. */
export function kaplanMeier(time: ArrayLike<number>, failed: ArrayLike<boolean>, level: number): KaplanMeierEstimate {
  const n = time.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => time[a] - time[b] || Number(failed[b]) - Number(failed[a]));
  const q = waldQuantile(level);
  const steps: SurvivalStep[] = [];
  const censoredTimes: number[] = [];
  let atRisk = n;
  let survival = 1;
  let greenwood = 0;
  for (let k = 0; k < n;) {
    const t = time[order[k]];
    let failures = 0;
    let censored = 0;
    for (; k < n && time[order[k]] === t; k++) {
      if (failed[order[k]]) failures++;
      else {
        censored++;
        censoredTimes.push(t);
      }
    }
    if (failures > 0) {
      survival *= 1 - failures / atRisk;
      greenwood += atRisk > failures ? failures / (atRisk * (atRisk - failures)) : Number.POSITIVE_INFINITY;
      let lower: number | null = null;
      let upper: number | null = null;
      let standardError: number | null = null;
      if (survival > 0 && Number.isFinite(greenwood)) {
        standardError = survival * Math.sqrt(greenwood);
        if (survival < 1) {
          const eta = Math.log(-Math.log(survival));
          const se = Math.sqrt(greenwood) / Math.abs(Math.log(survival));
          lower = Math.exp(-Math.exp(eta + q * se));
          upper = Math.exp(-Math.exp(eta - q * se));
        }
      }
      steps.push({ time: t, atRisk, failures, survival, standardError, lower, upper });
    }
    atRisk -= failures + censored;
  }
  return { method: 'kaplanMeier', steps, censoredTimes, intervalLevel: level };
}
