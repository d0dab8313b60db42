// A nonlinear model in the report's words: what its expression is (its
// parameters named, the rest being data columns) and how its fit ended —
// which stopping test ended Levenberg–Marquardt, the refinement in extended
// precision, the certificate, and what became of every other start vector —
// so a reviewer need not read the JSON record to know whether to trust it.
import { finiteOrNull, formatCount, formatSignificant } from './number-format.ts';
import type { ConvergenceView, ModelView } from './types.ts';

/** "nonlinear in eq, m0, k: eq + (m0 - eq)*exp(-k*hours)": the parameters are the coefficients' terms. */
export function expressionInWords(m: ModelView): string {
  const parameters = (m.coefficients ?? []).map((c) => c.term).filter((t): t is string => typeof t === 'string');
  return parameters.length === 0 ? `nonlinear: ${m.expression}` : `nonlinear in ${parameters.join(', ')}: ${m.expression}`;
}

const stoppedByWords: Record<string, string> = {
  reduction: 'the sum of squares stopped falling (relative reduction at rounding level)',
  step: 'the step shrank to rounding level',
  gradient: 'the residuals became orthogonal to every parameter\'s direction (gradient test)',
  rounding: 'rounding allowed no further progress',
};

const startWords: Record<string, string> = {
  converged: 'converged',
  'iteration-cap': 'reached the iteration cap',
  'no-minimum': 'stopped short of a minimum',
  'rank-deficient': 'ended with parameters it could not tell apart',
  'non-finite': 'met values that are not finite',
  'start-not-finite': 'was not finite at its start',
};

interface StartView { start?: unknown; status?: unknown; rss?: unknown }

function plural(count: number, word: string): string {
  return `${formatCount(count)} ${word}${count === 1 ? '' : 's'}`;
}

/** What the other start vectors did, numbered from 1 as a person counts them. */
function otherStarts(c: ConvergenceView): string | null {
  const starts = Array.isArray(c.starts) ? (c.starts as StartView[]) : [];
  const won = finiteOrNull(c.start);
  if (starts.length < 2 || won === null) return null;
  const others = starts.filter((s) => finiteOrNull(s.start) !== won).map((s) => {
    const which = finiteOrNull(s.start);
    const words = startWords[String(s.status)] ?? String(s.status);
    const rss = finiteOrNull(s.rss);
    return `start ${which === null ? '?' : formatCount(which + 1)} ${words}${s.status === 'converged' && rss !== null ? ` (residual sum of squares ${formatSignificant(rss)})` : ''}`;
  });
  return `start ${formatCount(won + 1)} of ${starts.length} won; ${others.join('; ')}`;
}

/**
 * "converged after 7 iterations: the sum of squares stopped falling …; 2
 * refinement steps in extended precision; a further Gauss–Newton step would
 * move the estimates by 3.1 × 10⁻¹² of their size". Null when the record has
 * no stopping test (not a nonlinear fit).
 */
export function nonlinearConvergenceInWords(c: ConvergenceView): string | null {
  if (typeof c.stoppedBy !== 'string') return null;
  const iterations = finiteOrNull(c.iterations);
  const parts = [`${c.converged === false ? 'did not converge' : 'converged'}${iterations === null ? '' : ` after ${plural(iterations, 'iteration')}`}: ${stoppedByWords[c.stoppedBy] ?? c.stoppedBy}`];
  const refinement = finiteOrNull(c.refinementSteps);
  if (refinement !== null) parts.push(`${plural(refinement, 'refinement step')} in extended precision`);
  const step = finiteOrNull(c.finalStep);
  if (step !== null) parts.push(`a further Gauss–Newton step would move the estimates by ${step === 0 ? 'nothing' : `${formatSignificant(step, 'n/a', 2)} of their size`}`);
  const starts = otherStarts(c);
  if (starts) parts.push(starts);
  return parts.join('; ');
}
