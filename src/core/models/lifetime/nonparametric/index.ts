// The nonparametric estimate a picture draws against the fitted
// distributions: Kaplan–Meier when every observation is exact or
// right-censored, Turnbull's estimate as soon as any is left- or
// interval-censored (with exact and right-censored data alone the two agree).
import { EXACT, RIGHT, type CensoredResponse } from '../censoring.ts';
import { kaplanMeier, type KaplanMeierEstimate } from './kaplan-meier.ts';
import { turnbull, type TurnbullEstimate } from './turnbull.ts';

export { kaplanMeier, type KaplanMeierEstimate, type SurvivalStep } from './kaplan-meier.ts';
export { turnbull, TURNBULL_RULE, type TurnbullEstimate, type TurnbullInterval } from './turnbull.ts';

export function nonparametricEstimate(response: CensoredResponse, level: number): KaplanMeierEstimate | TurnbullEstimate {
  if (response.status.every((s) => s === EXACT || s === RIGHT)) {
    return kaplanMeier(response.time, Array.from(response.status, (s) => s === EXACT), level);
  }
  return turnbull(response);
}
