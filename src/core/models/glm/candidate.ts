// The two candidate forms of this kind as the comparison receives them: a
// model fitted here (terms with a family, link and offset) and means fitted
// elsewhere. The request's trials column travels with each candidate.
import type { Term } from '../../types.ts';
import type { GlmFamilyName, GlmLinkName } from './types.ts';

export interface GlmCandidateInput {
  form: 'glm';
  name: string;
  terms: Term[];
  intercept: boolean;
  family: GlmFamilyName;
  /** Default: the family's canonical link. */
  link?: GlmLinkName;
  /** A numeric column added to the linear predictor as it is. */
  offset?: string;
  /** The request's trials column (binomial successes out of trials). */
  trials?: string;
}

export interface FittedMeansCandidateInput {
  form: 'fitted';
  name: string;
  family: GlmFamilyName;
  /** Aligned like residuals: one per used row, or one per data row with null at dropped rows. */
  fitted: (number | null)[];
  parameters: number;
  theta?: number;
  shape?: number;
  dispersion?: number;
  trials?: string;
}

/** Columns a candidate of this kind reads besides the response and weights, so the comparison's rows leave out rows missing any of them. */
export function glmExtraColumns(c: { offset?: string; trials?: string; family: GlmFamilyName }): string[] {
  return [...(c.offset ? [c.offset] : []), ...(c.trials && c.family === 'binomial' ? [c.trials] : [])];
}
