// A comparison from start to finish: common rows, response and weights, every
// candidate's design and fit, rankings under every criterion, the verdict.
// Returns the result, or every issue that prevents it (never throws for input).
import { buildDesign, columnsUsedBy, commonRows, responseValues, weightValues } from '../design/index.ts';
import { CRITERIA, type CriterionName } from '../criteria.ts';
import { rankModels, type RankingEntry } from '../ranking.ts';
import { verdict, type Verdict } from '../verdict.ts';
import { issue, type Issue } from '../issues.ts';
import { datasetFingerprint } from '../fingerprint.ts';
import type { Columns, DesignMatrix } from '../types.ts';
import { fitCandidate, type FittedCandidateInput, type FittedModel, type ModelResult } from './fitted-model.ts';
import { rowsDroppedCaution, STANDING_CAUTION, type Caution } from './cautions.ts';
import { conventions, type Conventions } from './conventions.ts';

export interface ComparisonInput {
  columns: Columns;
  response: string;
  weights: string | null;
  candidates: FittedCandidateInput[];
  rankBy: CriterionName;
  confidenceLevel: number;
}

export interface ComparisonLimits {
  /** Most rows × design columns, summed over candidates, one request may ask for. */
  maxWorkCells: number;
}

export interface ComparisonOutcome {
  conventions: Conventions;
  dataset: { fingerprint: string; observations: number; rowsDropped: number; response: string; weights: string | null };
  models: ModelResult[];
  rankings: Record<CriterionName, RankingEntry[]>;
  verdict: Verdict;
  cautions: Caution[];
}

export function compareModels(
  input: ComparisonInput,
  limits: ComparisonLimits,
): { result: ComparisonOutcome; fitted: FittedModel[] } | { issues: Issue[] } {
  const { columns, response, candidates } = input;
  const weightsName = input.weights ?? null;
  const termColumns = [...new Set(candidates.flatMap((c) => columnsUsedBy(c.terms)))];
  const used = [response, ...(weightsName ? [weightsName] : []), ...termColumns];
  const { rows, dropped } = commonRows(columns, used);
  const total = rows.length + dropped;

  const issues: Issue[] = [];
  const y = responseValues(columns, response, rows);
  if ('issues' in y) issues.push(...y.issues);
  const w = weightsName ? weightValues(columns, weightsName, rows) : null;
  if (w && 'issues' in w) issues.push(...w.issues);

  const designs: (DesignMatrix | null)[] = candidates.map((candidate, i) => {
    const built = buildDesign(columns, candidate.terms, candidate.intercept, rows, ['candidates', i]);
    if ('issues' in built) {
      issues.push(...built.issues);
      return null;
    }
    return built.design;
  });
  if (issues.length > 0) return { issues };
  if (rows.length === 0) return { issues: [issue('all_rows_dropped', ['data', 'columns'], { rows: total, dropped })] };

  let work = 0;
  designs.forEach((design, i) => {
    const p = design!.labels.length;
    work += rows.length * p;
    // More coefficients than rows: no criterion can be computed.
    if (p > rows.length) issues.push(issue('too_few_rows', ['candidates', i], { rows: rows.length, parameters: p }));
  });
  if (work > limits.maxWorkCells) {
    issues.push(issue('work_limit', ['candidates'], { cells: work, limit: limits.maxWorkCells, setting: 'MAX_WORK_CELLS' }));
  }
  if (issues.length > 0) return { issues };

  const yValues = (y as { values: Float64Array }).values;
  const weights = w && 'values' in w ? w : null;
  const fitted = candidates.map((candidate, i) => fitCandidate(candidate, designs[i]!, yValues, weights));
  const models = fitted.map((f) => f.result);

  const rankings = {} as Record<CriterionName, RankingEntry[]>;
  for (const def of CRITERIA) {
    rankings[def.name] = rankModels(
      models.map((m) => ({ name: m.name, value: m[def.name] })),
      { direction: def.direction, weighted: def.weighted, confidenceLevel: input.confidenceLevel },
    );
  }
  const parameters = Object.fromEntries(models.map((m) => [m.name, m.parameters]));
  const cautions = [STANDING_CAUTION, rowsDroppedCaution(dropped, total)].filter((c): c is Caution => c !== null);

  return {
    fitted,
    result: {
      conventions: conventions(input.rankBy, input.confidenceLevel),
      dataset: {
        fingerprint: datasetFingerprint({ columns, response, weights: weightsName, used: termColumns, rows }),
        observations: rows.length,
        rowsDropped: dropped,
        response,
        weights: weightsName,
      },
      models,
      rankings,
      verdict: verdict(rankings, input.rankBy, { parameters, observations: rows.length }),
      cautions,
    },
  };
}
