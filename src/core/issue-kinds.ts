// Issue codes of the kinds of model beyond least squares — lifetime
// distributions and censoring, generalised linear models, nonlinear mean
// functions — with their facts and their words. src/core/issues.ts joins them
// to the shared codes; one file per concern keeps each list readable.
import { quoteList } from './issue-words.ts';

export interface KindIssueFacts {
  // Lifetime distributions and censored observations (src/core/models/lifetime).
  censoring_status_unknown: { column: string; row: number; value: string };
  /** column null: the request names no upper column at all. */
  censoring_upper_missing: { column: string | null; row: number };
  censoring_upper_not_numeric: { column: string; row: number; value: string };
  censoring_upper_not_above: { column: string; row: number; lower: number; upper: number };
  lifetime_distribution_unknown: { distribution: string; known: string[] };
  lifetime_time_not_positive: { column: string; row: number; value: number; status: string; distribution: string };
  lifetime_no_failures: { rows: number; notEstimable: string[] };
  lifetime_only_left_censored: { rows: number; notEstimable: string[] };
  lifetime_option_invalid: { option: string; value: number; rule: string };
  lifetime_not_converged: {
    name: string;
    distribution: string;
    iterations: number;
    reason: 'iteration_limit' | 'no_ascent' | 'information_singular' | 'scale_collapsed' | 'estimates_diverge';
  };
  /** A candidate whose likelihood takes every response value as observed, on rows that are censored. */
  censored_response_refused: { name: string; form: string; censored: number; rows: number };
  lifetime_weights_not_supported: { candidates: string[] };
  /** A probability mass and a density in one comparison (path: the first mass candidate). */
  // Generalised linear models (src/core/models/glm).
  glm_link_not_allowed: { family: string; link: string; allowed: string[] };
  glm_trials_invalid: { row: number; value: number };
  glm_successes_above_trials: { row: number; successes: number; trials: number };
  glm_count_not_integer: { family: string; row: number; value: number };
  glm_response_outside_support: { family: string; row: number; value: number; support: string };
  glm_weights_not_supported: { family: string };
  glm_no_valid_start: { family: string; link: string };
  glm_step_outside_domain: { family: string; link: string; iteration: number };
  // canonical: the link is already the family's canonical one, so the message does not suggest it.
  glm_not_converged: { family: string; link: string; canonical: boolean; iterations: number; change: number | null; step: number | null };
  glm_separation: { family: string; terms: string[]; rows: number };
  glm_theta_unbounded: { theta: number };
  glm_dispersion_degenerate: { family: string; parameter: string };
  glm_fitted_count_mismatch: { fitted: number; rows: number; dataRows: number };
  glm_fitted_mean_invalid: { family: string; row: number; value: number; support: string };
  glm_distribution_parameter_invalid: { family: string; parameter: string; value: number | null };
  glm_fitted_missing: { row: number };
  glm_fitted_at_dropped_row: { row: number; rows: number[]; count: number };
  glm_column_not_numeric: { column: string; row: number; value: string | null };
  overdispersion_no_model: Record<string, never>;
  /** A request-level trials column with no binomial candidate to read it (candidates: name and kind, in words). */
  // search: refused for a search, whose subsets share one family (there are no candidates to add).
  trials_without_binomial: { trials: string; candidates: string[]; search?: boolean };
  /** rankBy names QAIC or QAICc in a comparison without options.overdispersion. */
  rank_by_needs_overdispersion: { rankBy: string };
  /** Candidates whose likelihoods are a probability mass beside ones that are a density: never ranked together. */
  measures_mixed: { mass: string[]; density: string[] };
  // Nonlinear mean functions (models/nonlinear): the expression, its
  // parameters, start vectors and bounds, and fits that end without a
  // solution. Offsets count characters (Unicode code points) from 0.
  expression_syntax: { offset: number; expected: string; found: string };
  expression_unknown_function: { offset: number; name: string; functions: string[] };
  expression_unknown_column: { offset: number; column: string };
  expression_column_not_numeric: { offset: number; column: string; row: number; value: string };
  expression_too_long: { length: number; limit: number };
  expression_too_deep: { offset: number; limit: number };
  parameter_unused: { parameter: string };
  parameter_name_invalid: { parameter: string; reason: string };
  parameters_too_many: { parameters: number; limit: number };
  start_missing: { given: 'neither' | 'both' };
  starts_parameters_differ: { missing: string[]; extra: string[] };
  start_value_not_finite: { parameter: string };
  bound_unknown_parameter: { parameter: string };
  bound_invalid: { parameter: string; lower: number | null; upper: number | null };
  start_outside_bounds: { parameter: string; value: number; lower: number | null; upper: number | null };
  nonlinear_start_not_finite: { candidate: string; start: number; row: number };
  nonlinear_not_converged: { candidate: string; reason: 'iteration cap' | 'no minimum'; iterations: number; limit: number; starts: number };
  // row: the first data row without a finite value; -1 when no row is known (the final refinement failed), and the message then names none.
  nonlinear_non_finite: { candidate: string; row: number; starts: number };
  nonlinear_rank_deficient: { candidate: string; parameters: string[] };
}

export const KIND_MESSAGES: { [C in keyof KindIssueFacts]: (f: KindIssueFacts[C], at: string) => string } = {
  // Lifetime distributions and censored observations (src/core/models/lifetime).
  censoring_status_unknown: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which holds ${JSON.stringify(f.value)} at row ${f.row}; a censoring status is one of "exact", "right", "left" or "interval".`,
  censoring_upper_missing: (f, at) =>
    f.column === null
      ? `${at} names no upper column, but row ${f.row} is an interval row; an interval-censored unit needs the end of its window in the upper column.`
      : `${at} names column ${JSON.stringify(f.column)}, which has no number at row ${f.row}, an interval row; an interval-censored unit needs the end of its window there.`,
  censoring_upper_not_numeric: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which holds the string ${JSON.stringify(f.value)} at row ${f.row}; the end of an interval must be a number.`,
  censoring_upper_not_above: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, whose value at row ${f.row} (${f.upper}) is not above the response there (${f.lower}); an interval-censored unit failed between the response value and a later upper value.`,
  lifetime_distribution_unknown: (f, at) =>
    `${at} asks for distribution ${JSON.stringify(f.distribution)}, which is not one of ${quoteList(f.known)}.`,
  lifetime_time_not_positive: (f, at) =>
    `${at} is ${JSON.stringify(f.distribution)}, a distribution of positive time, but column ${JSON.stringify(f.column)} holds ${f.value} at row ${f.row} (${({ exact: 'an exact failure', right: 'a right-censored unit', left: 'a left-censored unit', interval: 'the start of an interval' } as Record<string, string>)[f.status] ?? f.status}); use a distribution on the time scale (normal, logistic, smallestExtremeValue) or correct the time.`,
  lifetime_no_failures: (f, at) =>
    `${at}: all ${f.rows} units are right-censored, so no unit failed and the likelihood keeps growing as the life grows; ${quoteList(f.notEstimable)} cannot be estimated. A life model needs at least one failure (an exact, left- or interval-censored row).`,
  lifetime_only_left_censored: (f, at) =>
    `${at}: all ${f.rows} units are left-censored (each had failed before its time), so the likelihood keeps growing as the life shrinks; ${quoteList(f.notEstimable)} cannot be estimated. A life model needs at least one exact, right- or interval-censored row.`,
  lifetime_option_invalid: (f, at) => `${at} is ${f.value}; ${f.rule}.`,
  lifetime_not_converged: (f, at) => {
    const why = {
      iteration_limit: 'the iteration limit was reached before the convergence rule was met.',
      no_ascent: 'no step along the Newton direction increased the likelihood, short of the convergence rule.',
      information_singular: 'the observed information is singular at the estimates, so they are not determined (too few failures for the parameters, or a term that does not vary among the failures).',
      scale_collapsed: 'the scale shrank towards zero, so the likelihood has no maximum (the failures are too few or coincide).',
      estimates_diverge: 'the likelihood keeps rising as the estimates grow without limit (for example a factor level or a range of a term with no failures, or every failure before every censored unit).',
    }[f.reason];
    return `${at} (${JSON.stringify(f.name)}, ${f.distribution}) did not reach a maximum of its likelihood after ${f.iterations} Newton–Raphson iterations: ${why}`;
  },
  censored_response_refused: (f, at) =>
    `${at} (${JSON.stringify(f.name)}, ${f.form}) treats every response value as an observed failure time, but ${f.censored} of the ${f.rows} rows are censored (censoring.status): its likelihood would take a censoring time for a failure. Use a candidate with a distribution, or send this model's censored log-likelihood as a logLikelihood candidate.`,
  lifetime_weights_not_supported: (f, at) =>
    `${at}: the lifetime candidates ${quoteList(f.candidates)} do not take weights (each row is one unit); leave weights out, or send repeated units as repeated rows.`,
  // Generalised linear models (src/core/models/glm).
  glm_link_not_allowed: (f, at) =>
    `${at} asks for the ${f.link} link with the ${f.family} family, which admits only ${quoteList(f.allowed)}; choose one of those links or leave link out for the family's canonical link.`,
  glm_trials_invalid: (f, at) =>
    `${at} is ${f.value} at row ${f.row}; trials must be whole numbers of 1 or more.`,
  glm_successes_above_trials: (f, at) =>
    `${at} has ${f.successes} successes at row ${f.row}, more than its ${f.trials} trials; successes must lie between 0 and the trials.`,
  glm_count_not_integer: (f, at) =>
    `${at} holds ${f.value} at row ${f.row}; the ${f.family} family models counts, so the response must be whole numbers of 0 or more${f.family === 'binomial' ? ' (0 or 1 without trials)' : ''}.`,
  glm_response_outside_support: (f, at) =>
    `${at} holds ${f.value} at row ${f.row}, outside the ${f.family} family's range; the response must be ${f.support}.`,
  glm_weights_not_supported: (f, at) =>
    `${at}: relative weights apply to the gaussian family only; a ${f.family} likelihood with weights is not a likelihood of the data (use trials for grouped binomial rows).`,
  glm_no_valid_start: (f, at) =>
    `${at}: no starting values put every fitted mean inside the ${f.family} family's range under the ${f.link} link; choose another link or check the response.`,
  glm_step_outside_domain: (f, at) =>
    `${at}: at iteration ${f.iteration} no step, however shortened, kept every fitted mean inside the ${f.family} family's range under the ${f.link} link; the maximum likelihood may lie on the boundary — choose another link.`,
  glm_not_converged: (f, at) =>
    `${at} did not converge in ${f.iterations} iterations (last relative change of the deviance ${f.change === null ? 'unknown' : f.change.toExponential(2)}, last step ${f.step === null ? 'unknown' : `${f.step.toExponential(2)} standard errors`}); its estimates cannot be ranked. ${f.canonical
      ? `The ${f.link} link is already the ${f.family} family's canonical one: fewer terms, merged factor levels or rescaled covariates may let it settle.`
      : `The maximum may lie on the edge of the ${f.family} family's range under the ${f.link} link: try the canonical link.`}`,
  glm_separation: (f, at) =>
    `${at}: the ${f.family} likelihood keeps rising as the coefficients of ${quoteList(f.terms)} run to infinity (separation: ${f.rows} rows are fitted ever closer to their observed bound of 0${f.family === 'binomial' ? ' or the trials' : ''}), so their maximum-likelihood estimates do not exist; drop or merge those terms, or merge the factor levels involved.`,
  glm_theta_unbounded: (f, at) =>
    `${at}: the negative binomial θ grows without bound (past ${f.theta.toExponential(2)}) because the counts show no overdispersion; the Poisson model is its limit — fit family poisson instead.`,
  glm_dispersion_degenerate: (f, at) =>
    `${at}: the ${f.family} fit reproduces the response exactly (deviance 0), so the maximum-likelihood ${f.parameter} is unbounded and the likelihood has no finite value.`,
  glm_fitted_count_mismatch: (f, at) =>
    `${at} has ${f.fitted} fitted means; send one per row the comparison uses (${f.rows}) or one per data row (${f.dataRows}) with null where a row is dropped.`,
  glm_fitted_mean_invalid: (f, at) =>
    `${at} is ${f.value} at row ${f.row}; a ${f.family} fitted mean must be ${f.support}.`,
  glm_distribution_parameter_invalid: (f, at) =>
    `${at}: the ${f.family} family needs its ${f.parameter} as a positive finite number${f.value === null ? '' : `, not ${f.value}`}.`,
  glm_fitted_missing: (f, at) =>
    `${at} is null at data row ${f.row}, which the comparison uses; every used row needs a fitted mean.`,
  glm_fitted_at_dropped_row: (f, at) =>
    `${at} has fitted means at ${f.count === 1 ? 'data row' : `${f.count} data rows`} ${f.rows.join(', ')}${f.count > f.rows.length ? ', …' : ''}, which the comparison drops (a missing value, or a zero weight, in a column some candidate uses); the model's likelihood would then cover rows the other candidates are not scored on — refit it on the common rows and send its means there.`,
  glm_column_not_numeric: (f, at) =>
    `${at} names column ${JSON.stringify(f.column)}, which holds ${f.value === null ? 'no number' : `the string ${JSON.stringify(f.value)}`} at row ${f.row}; it must hold numbers.`,
  overdispersion_no_model: (_f, at) =>
    `${at} is "estimate", but no generalised linear model fitted here has residual degrees of freedom and a positive Pearson χ² to estimate ĉ from; give ĉ as a number, or add the most general count model as a candidate.`,
  trials_without_binomial: (f, at) =>
    f.search
      ? `${at} names the column ${JSON.stringify(f.trials)}, but trials are read only by a binomial search (family "binomial": successes out of trials), and this search fits ${f.candidates.join(', ')}. Drop trials, or set family to "binomial".`
      : `${at} names the column ${JSON.stringify(f.trials)}, but trials are read only by binomial candidates (family "binomial": successes out of trials), and none is binomial: ${f.candidates.join(', ')}. Drop trials, or add the binomial candidate meant to use it.`,
  rank_by_needs_overdispersion: (f, at) =>
    `${at} is "${f.rankBy}", but ${f.rankBy === 'qaic' ? 'QAIC' : 'QAICc'} divides the log-likelihood by an overdispersion factor ĉ, and this comparison has none; give options.overdispersion ({ "cHat": a number } or { "cHat": "estimate" }), or rank by ${f.rankBy === 'qaic' ? 'aic' : 'aicc'}, what it is at ĉ = 1.`,
  measures_mixed: (f, at) =>
    `${at}: ${quoteList(f.mass)} ${f.mass.length === 1 ? 'has a likelihood that is a probability mass' : 'have likelihoods that are probability masses'} (counts or pass/fail outcomes) and ${quoteList(f.density)} ${f.density.length === 1 ? 'one that is a density' : 'ones that are densities'} (continuous measurements); a mass and a density are on different scales, so their criteria cannot be compared. Compare the count or pass/fail models among themselves and the continuous ones among themselves.`,
  // Nonlinear mean functions.
  expression_syntax: (f, at) => `${at} cannot be read at offset ${f.offset}: expected ${f.expected}, found ${f.found}.`,
  expression_unknown_function: (f, at) =>
    `${at} calls ${JSON.stringify(f.name)} at offset ${f.offset}, which is not a function of the grammar (${f.functions.join(', ')}).`,
  expression_unknown_column: (f, at) =>
    `${at} uses the name ${JSON.stringify(f.column)} at offset ${f.offset}, which is neither a parameter (a key of start) nor a column of the data.`,
  expression_column_not_numeric: (f, at) =>
    `${at} uses column ${JSON.stringify(f.column)} at offset ${f.offset}, which holds the string ${JSON.stringify(f.value)} at row ${f.row}; an expression needs numeric columns.`,
  expression_too_long: (f, at) => `${at} has ${f.length} characters, above the limit of ${f.limit}.`,
  expression_too_deep: (f, at) =>
    `${at} nests parentheses, functions, powers and minus signs more than ${f.limit} deep (at offset ${f.offset}).`,
  parameter_unused: (f, at) =>
    `${at} gives a start value for ${JSON.stringify(f.parameter)}, which the expression never uses; a parameter that does not enter the model cannot be estimated.`,
  parameter_name_invalid: (f, at) => `${at} names the parameter ${JSON.stringify(f.parameter)}, which ${f.reason}.`,
  parameters_too_many: (f, at) => `${at} has ${f.parameters} parameters, above the limit of ${f.limit}.`,
  start_missing: (f, at) =>
    f.given === 'both'
      ? `${at} gives both start and starts; give one start vector as start, or several as starts.`
      : `${at} gives no start values; a nonlinear candidate needs start (or starts), whose keys name its parameters.`,
  starts_parameters_differ: (f, at) =>
    `${at} does not name the same parameters as the first start vector${f.missing.length ? ` (missing ${quoteList(f.missing)})` : ''}${f.extra.length ? ` (extra ${quoteList(f.extra)})` : ''}; every start vector gives a value for every parameter.`,
  start_value_not_finite: (f, at) => `${at}, the start value of ${JSON.stringify(f.parameter)}, is not a finite number.`,
  bound_unknown_parameter: (f, at) => `${at} bounds ${JSON.stringify(f.parameter)}, which is not a parameter (a key of start).`,
  bound_invalid: (f, at) =>
    `${at} gives ${JSON.stringify(f.parameter)} the bounds [${f.lower}, ${f.upper}]; the lower bound must be below the upper one (null for none).`,
  start_outside_bounds: (f, at) =>
    `${at} starts ${JSON.stringify(f.parameter)} at ${f.value}, outside its bounds [${f.lower}, ${f.upper}].`,
  nonlinear_start_not_finite: (f, at) =>
    `${at} (${JSON.stringify(f.candidate)}) has no finite value at data row ${f.row} with start vector ${f.start}; choose start values where the expression is defined on every row.`,
  nonlinear_not_converged: (f, at) =>
    f.reason === 'iteration cap'
      ? `${at} (${JSON.stringify(f.candidate)}) did not converge within ${f.limit} iterations from ${f.starts === 1 ? 'its start vector' : `any of its ${f.starts} start vectors`}; it is not ranked. Try start values closer to the solution, bounds, or a simpler expression.`
      : `${at} (${JSON.stringify(f.candidate)}) stopped, from ${f.starts === 1 ? 'its start vector' : `each of its ${f.starts} start vectors`}, at parameter values that are not a least-squares minimum (a Gauss–Newton step from there still moves them); it is not ranked. The expression may not be smooth there, or a parameter may be heading for infinity or the edge of the expression's domain: try bounds or other start values.`,
  nonlinear_non_finite: (f, at) =>
    `${at} (${JSON.stringify(f.candidate)}) ran into parameter values where the expression or its derivatives have no finite value${f.row >= 0 ? ` (first at data row ${f.row})` : ''} and could not step around them from ${f.starts === 1 ? 'its start vector' : `any of its ${f.starts} start vectors`}; it is not ranked. Bounds on the parameters can keep the fit inside the expression's domain.`,
  nonlinear_rank_deficient: (f, at) =>
    `${at} (${JSON.stringify(f.candidate)}) ends with a Jacobian of deficient rank: ${quoteList(f.parameters)} ${f.parameters.length === 1 ? 'is' : 'are'} not identified by the data (some combination of parameters leaves the fitted values unchanged), so no standard errors or comparable parameter count exist; it is not ranked. Remove or fix the redundant parameters.`,
};
