// A search request (rows or a data summary) reduced to the kernel's problem,
// with everything needed afterwards to refit the best subsets exactly as a
// comparison would. Problems with the request come back as issues.
import { buildDesign, columnsUsedBy, sampleRows } from '../design/index.ts';
import { termLabel } from '../design/labels.ts';
import { datasetFingerprint } from '../fingerprint.ts';
import { issue, type Issue, type IssueFacts, type IssuePath } from '../issues.ts';
import type { Columns, DesignMatrix, Term } from '../types.ts';
import { summaryFingerprint, summaryIssues, summaryPredictors, summaryResponseIssues, validateSummary, type DataSummary } from '../summary/index.ts';
import { transformResponse, type ResponseTransformSpec } from '../models/response-transform.ts';
import { hierarchyRules, noHierarchy, type HierarchyRules } from './hierarchy.ts';
import { subsetProblemFromDesign, subsetProblemFromSummary } from './problem.ts';
import type { SubsetProblem } from './types.ts';
import type { GlmSearchSpec } from './glm/types.ts';
import { glmExtraColumns } from '../models/glm/candidate.ts';

export interface SearchRequestInput {
  /** Exactly one of columns and summary. */
  columns: Columns | null;
  summary: DataSummary | null;
  response: string;
  weights: string | null;
  pool: Term[];
  always: Term[];
  hierarchy: boolean;
  intercept: boolean;
  top: number;
  /** Every subset describes g(response) (needs rows: the Jacobian sums over them); null for the response itself. */
  responseTransform?: ResponseTransformSpec | null;
  /** Every subset a generalised linear model of this family (search/glm); null or absent for least squares. */
  glm?: GlmSearchSpec | null;
  /** The request's trials column: read by a binomial search only, refused with any other (as a comparison refuses it without a binomial candidate). */
  trials?: string | null;
}

export type SearchSource =
  | {
      kind: 'rows'; columns: Columns; rows: number[]; weights: { values: Float64Array; sumLogWeights: number } | null;
      /** The response on the subsets' scale (transformed when the request says so) and Σ ln g'(y) (0 without a transform). */
      y: Float64Array; jacobian: number;
      /** Rows left out, for a missing value or a zero weight; zeroWeights counts the latter. */
      dropped: number; zeroWeights: number;
    }
  | { kind: 'summary'; summary: DataSummary; pool: string[]; always: string[] };

export interface PreparedSearch {
  input: SearchRequestInput;
  problem: SubsetProblem;
  rules: HierarchyRules;
  source: SearchSource;
  fingerprint: string;
}

/** buildDesign reports terms/j of the combined list [...pool, ...always]; point back into the request. */
function intoRequest(found: Issue, poolSize: number): Issue {
  const { code, path, message: _message, ...facts } = found as Issue & Record<string, unknown>;
  let at: IssuePath = path;
  if (path[0] === 'terms' && typeof path[1] === 'number') {
    const j = path[1];
    at = j < poolSize ? ['pool', j, ...path.slice(2)] : ['always', j - poolSize, ...path.slice(2)];
  }
  return issue(code, at, facts as unknown as IssueFacts[typeof code]);
}

function fromRows(input: SearchRequestInput, columns: Columns, rules: HierarchyRules): PreparedSearch | { issues: Issue[] } {
  const terms = [...input.pool, ...input.always];
  // A GLM search's offset and trials columns leave out the rows where they are missing, as a comparison's candidates do.
  const used = [...columnsUsedBy(terms), ...(input.glm ? glmExtraColumns(input.glm) : [])];
  const sample = sampleRows(columns, input.response, input.weights, used);
  if ('issues' in sample) return sample;
  const { rows, dropped, zeroWeights } = sample;
  const built = buildDesign(columns, terms, input.intercept, rows);
  if ('issues' in built) return { issues: built.issues.map((i) => intoRequest(i, input.pool.length)) };
  const varying = codingIssues(input, columns, rows, built.design);
  if (varying.length > 0) return { issues: varying };
  const weights = sample.weights;
  let scale = { values: sample.y, jacobian: 0 };
  if (input.responseTransform) {
    const transformed = transformResponse(sample.y, rows, input.responseTransform, ['responseTransform']);
    if ('issues' in transformed) return transformed;
    scale = transformed;
  }
  const problem = subsetProblemFromDesign(built.design, scale.values, weights?.values ?? null, input.pool.length, rules);
  return {
    input,
    rules,
    problem: { ...problem, logJacobian: scale.jacobian },
    source: { kind: 'rows', columns, rows, y: scale.values, jacobian: scale.jacobian, weights, dropped, zeroWeights },
    fingerprint: datasetFingerprint({ columns, response: input.response, weights: input.weights, used, rows }),
  };
}

/** Term j's design columns (labels and values) in `design`. */
function termColumns(design: DesignMatrix, j: number): { label: string; high: Float64Array; low: Float64Array }[] {
  const out: { label: string; high: Float64Array; low: Float64Array }[] = [];
  design.termOfColumn.forEach((term, c) => {
    if (term === j) out.push({ label: design.labels[c], high: design.high[c], low: design.low[c] });
  });
  return out;
}

function sameColumns(a: ReturnType<typeof termColumns>, b: ReturnType<typeof termColumns>): boolean {
  if (a.length !== b.length) return false;
  return a.every((x, c) => x.label === b[c].label && x.high.every((v, i) => v === b[c].high[i]) && x.low.every((v, i) => v === b[c].low[i]));
}

/**
 * The kernel scores every subset on the columns of one design built over all
 * pool and always terms, where a factor declaration holds for every use of
 * its column. A subset's refit (and a comparison) builds its own terms only,
 * so a declaration on one pool term would recode another term in some
 * subsets and not in others: the search would score one model and report
 * another. Each term is built as the smallest subset holding it builds it
 * (the term with the always terms; the always terms alone) and compared with
 * its columns in the combined design; any difference refuses the request.
 */
function codingIssues(input: SearchRequestInput, columns: Columns, rows: number[], combined: DesignMatrix): Issue[] {
  const m = input.pool.length;
  const issues: Issue[] = [];
  const declarers = (term: Term): Term[] => {
    const used = new Set(columnsUsedBy([term]));
    return input.pool.filter((u) => u !== term && typeof u === 'object' && u.kind === 'factor' && used.has(u.of));
  };
  const check = (alone: ReturnType<typeof buildDesign>, position: number, combinedIndex: number, at: IssuePath, term: Term) => {
    const same = !('issues' in alone) && sameColumns(termColumns(alone.design, position), termColumns(combined, combinedIndex));
    if (same) return;
    const by = declarers(term)[0];
    const column = by && typeof by === 'object' && by.kind === 'factor' ? by.of : columnsUsedBy([term])[0] ?? '';
    issues.push(issue('search_coding_varies', at, { label: termLabel(term), column, declaredBy: by ? termLabel(by) : 'another pool term' }));
  };
  input.pool.forEach((term, j) => check(buildDesign(columns, [term, ...input.always], input.intercept, rows), 0, j, ['pool', j], term));
  if (input.always.length > 0) {
    const always = buildDesign(columns, input.always, input.intercept, rows);
    input.always.forEach((term, i) => check(always, i, m + i, ['always', i], term));
  }
  return issues;
}

function fromSummary(input: SearchRequestInput, summary: DataSummary, rules: HierarchyRules): PreparedSearch | { issues: Issue[] } {
  if (input.glm) {
    // IRLS reweights every row at every step; cross products summed once cannot be reweighted.
    return { issues: [issue('summary_rows_needed', ['family'], { form: 'a generalised linear search', reason: 'each IRLS step reweights every row, which cross products summed once cannot do' })] };
  }
  if (input.responseTransform) {
    // The summary holds cross products of y, not of g(y), and the Jacobian sums ln g'(y) over rows it does not carry.
    return { issues: [issue('summary_rows_needed', ['responseTransform'], { form: 'a response transform', reason: 'its Jacobian sums ln g\'(y) over the rows' })] };
  }
  const invalid = validateSummary(summary);
  if (invalid.length > 0) return { issues: summaryIssues(invalid) };
  const issues = summaryResponseIssues(summary, input.response);
  const pool = summaryPredictors(summary, input.pool, ['pool']);
  const always = summaryPredictors(summary, input.always, ['always']);
  if ('issues' in pool) issues.push(...pool.issues);
  if ('issues' in always) issues.push(...always.issues);
  if ('issues' in pool || 'issues' in always || issues.length > 0) return { issues };
  const seen = new Map<string, number>();
  [...pool.predictors, ...always.predictors].forEach((name, j) => {
    const first = seen.get(name);
    const at: IssuePath = j < pool.predictors.length ? ['pool', j] : ['always', j - pool.predictors.length];
    if (first !== undefined) issues.push(issue('duplicate_term', at, { label: name, first }));
    else seen.set(name, j);
  });
  if (issues.length > 0) return { issues };
  const built = subsetProblemFromSummary(summary, {
    response: input.response,
    pool: pool.predictors.map((p) => [p]),
    always: always.predictors,
    intercept: input.intercept,
    requires: rules.requires,
    blocked: rules.unreachable.map((u) => u.term),
  });
  if (!built.ok) return { issues: summaryIssues(built.issues) };
  return {
    input,
    rules,
    problem: built.problem,
    source: { kind: 'summary', summary, pool: pool.predictors, always: always.predictors },
    fingerprint: summaryFingerprint(summary),
  };
}

/** What the search may cost was settled from the request's shape before this runs (src/core/pricing). */
export function prepareSearch(input: SearchRequestInput): PreparedSearch | { issues: Issue[] } {
  if (input.trials && input.glm?.family !== 'binomial') {
    const subsets = input.glm ? `every subset (family ${JSON.stringify(input.glm.family)})` : 'every subset (least squares)';
    return { issues: [issue('trials_without_binomial', ['trials'], { trials: input.trials, candidates: [subsets], search: true })] };
  }
  const rules = input.hierarchy ? hierarchyRules(input.pool, input.always) : noHierarchy(input.pool.length);
  if (rules.alwaysUnmet.length > 0) {
    // Every subset holds the always terms, so a need of theirs outside always breaks the rule in some or every subset.
    return {
      issues: rules.alwaysUnmet.map((u) =>
        issue('hierarchy_always_incomplete', ['always', u.term], {
          label: termLabel(input.always[u.term]),
          needs: u.poolTerm !== null ? termLabel(input.pool[u.poolTerm]) : u.needs.join('×'),
          inPool: u.poolTerm !== null,
        }),
      ),
    };
  }
  if (input.summary) return fromSummary(input, input.summary, rules);
  if (input.columns) return fromRows(input, input.columns, rules);
  return { issues: [issue('data_required', ['data'], { form: 'a search' })] };
}

/** A subset's readable name: its terms' labels joined by " + ". */
export function subsetName(terms: readonly Term[], intercept: boolean): string {
  if (terms.length === 0) return intercept ? '(intercept only)' : '(no terms)';
  return terms.map(termLabel).join(' + ');
}
