// The request-level trials column is read by binomial candidates only (the
// response is then successes out of trials). Sent with no binomial candidate
// it would be silently ignored — and the caller plainly meant something by
// it — so that is refused; sent with binomial candidates beside others (a
// Poisson of the same counts, say), the others model the response without
// it, which is legitimate but said in a caution so nobody thinks they used it.
import { issue, type Issue } from '../issues.ts';
import type { Caution } from '../scoring/cautions.ts';
import type { CandidateInput } from '../models/registry.ts';

/** What a candidate is, in the words the refusal and the caution use. */
function kindInWords(c: CandidateInput): string {
  switch (c.form) {
    case 'glm':
    case 'fitted':
      return `${c.family}${c.form === 'fitted' ? ', fitted elsewhere' : ''}`;
    case 'fit':
      return 'least squares';
    case 'lifetime':
      return `life distribution ${c.distribution}`;
    case 'expression':
      return 'nonlinear';
    default:
      return 'fitted elsewhere';
  }
}

const isBinomial = (c: CandidateInput) => (c.form === 'glm' || c.form === 'fitted') && c.family === 'binomial';

export type TrialsUse = { issue: Issue } | { cautions: Caution[] };

export function trialsUse(trials: string | null | undefined, candidates: readonly CandidateInput[]): TrialsUse {
  if (!trials) return { cautions: [] };
  const others = candidates.filter((c) => !isBinomial(c)).map((c) => `${JSON.stringify(c.name)} (${kindInWords(c)})`);
  if (others.length === candidates.length) {
    return { issue: issue('trials_without_binomial', ['trials'], { trials, candidates: others }) };
  }
  if (others.length === 0) return { cautions: [] };
  return {
    cautions: [{
      code: 'trials_not_read',
      message: `The trials column ${JSON.stringify(trials)} is read by the binomial candidates only; ${others.join(', ')} ${others.length === 1 ? 'models' : 'model'} the response as it is, without trials.`,
    }],
  };
}
