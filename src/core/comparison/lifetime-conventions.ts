// What a comparison with life models adds to its conventions and cautions.
import type { CandidateInput } from '../models/registry.ts';
import type { Caution } from '../scoring/cautions.ts';
import { LIFETIME_CONVENTIONS } from '../models/lifetime/index.ts';

const hasLifetime = (candidates: readonly CandidateInput[]) => candidates.some((c) => c.form === 'lifetime');

/** Coefficient tests of a maximum-likelihood fit are Wald z tests, not the t tests of least squares. */
const LIFETIME_INFERENCE =
  'per coefficient of a lifetime model: tStatistic holds the Wald z = estimate / standardError (standard error from the observed information), pValue is two-sided from the standard normal, lower/upper = estimate ± z_{(1+L)/2} · standardError; there is no residual variance, so no Student\'s t';

export function lifetimeConventions(candidates: readonly CandidateInput[]): { lifetime?: Record<string, string> } {
  if (!hasLifetime(candidates)) return {};
  return { lifetime: { ...LIFETIME_CONVENTIONS, inference: LIFETIME_INFERENCE } };
}

export function lifetimeCautions(candidates: readonly CandidateInput[]): Caution[] {
  if (!hasLifetime(candidates)) return [];
  return [{ code: 'life_model_review', message: `Life models: ${LIFETIME_CONVENTIONS.caution}.` }];
}
