// Each kind of candidate prices itself from the request's shape: the price
// is part of the kind's entry in src/core/models/registry.ts (a new kind — a
// generalised linear, nonlinear or lifetime fit — adds its price there: its
// fit's work, an iterative fit as iterations × its per-iteration cost, the
// memory it keeps, its share of the answer, and what predictions from it
// cost), and TypeScript refuses a form without one. This file reads them.
import { CANDIDATE_KINDS, type CandidateForm, type CandidateInput, type OfForm } from '../models/registry.ts';
import type { IssuePath } from '../issues.ts';
import type { CandidateContext, CandidateCost } from './candidate-cost.ts';

export type { CandidateContext, CandidateCost } from './candidate-cost.ts';

export type CandidatePricer<F extends CandidateForm> = (candidate: OfForm<F>, ctx: CandidateContext) => CandidateCost;

/** Each candidate form's price, as its kind states it. */
export const CANDIDATE_PRICES: { [F in CandidateForm]: CandidatePricer<F> } = {
  fit: CANDIDATE_KINDS.fit.price,
  residuals: CANDIDATE_KINDS.residuals.price,
  rss: CANDIDATE_KINDS.rss.price,
  logLikelihood: CANDIDATE_KINDS.logLikelihood.price,
  glm: CANDIDATE_KINDS.glm.price,
  fitted: CANDIDATE_KINDS.fitted.price,
  lifetime: CANDIDATE_KINDS.lifetime.price,
  expression: CANDIDATE_KINDS.expression.price,
};

export function priceCandidate(candidate: CandidateInput, ctx: CandidateContext): CandidateCost {
  const pricer = CANDIDATE_PRICES[candidate.form] as CandidatePricer<CandidateForm>;
  return pricer(candidate, ctx);
}

/** Where a candidate sits in a comparison request. */
export const candidatePath = (index: number): IssuePath => ['candidates', index];
