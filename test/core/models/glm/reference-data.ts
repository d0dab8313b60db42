// Loads the R reference fits (test/reference/glm/glm-reference.json, made by
// scripts/glm-reference.R) and fits the same models here.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildDesign } from '../../../../src/core/design/index.ts';
import { fitGlm, type GlmFamilyName, type GlmFit, type GlmLinkName } from '../../../../src/core/models/glm/index.ts';
import type { Columns, DesignMatrix, Term } from '../../../../src/core/types.ts';

export interface ReferenceCase {
  family: GlmFamilyName;
  link: GlmLinkName;
  response: string;
  terms: Term[];
  trials: string | null;
  offset: string | null;
  data: Record<string, (number | string)[]>;
  coefficients: { term: string; estimate: number; standardError: number }[];
  deviance: number;
  nullDeviance: number;
  pearsonChiSquare: number;
  logLikelihood: number;
  parameters: number;
  aic: number;
  dispersion: number;
  distributionParameter: { name: string; estimate: number; standardError: number } | null;
  leverages: number[];
  cooksDistances: number[];
  devianceResiduals: number[];
  pearsonResiduals: number[];
  /** r_D / √(φ (1 − h)) with the service's φ. */
  standardisedDevianceResiduals: number[];
  /** Pearson's goodness-of-fit p-value, and qchisq(0.95, df) / df. */
  pearsonPValue: number;
  overdispersionThreshold: number;
  /** Set when R fitted another basis of the same column space (coefficients not comparable). */
  coefficientBasis?: string;
  /** Link-scale fit and standard error (R predict.glm), and the mean with its 95% interval mapped from the link scale. */
  prediction?: {
    rows: Record<string, (number | string)[]>; offset: number[] | null; link: number[]; standardError: number[];
    mean: number[]; lower: number[]; upper: number[];
  };
}

export interface ReferenceTest {
  smaller: string[];
  larger: string[];
  statistic: number;
  df: number;
  residualDf?: number;
  pValue: number;
}

export interface ReferenceFile {
  generatedWith: string;
  cases: Record<string, ReferenceCase | Record<string, unknown>>;
  tests: Record<string, ReferenceTest>;
}

export const REFERENCE: ReferenceFile = JSON.parse(
  readFileSync(fileURLToPath(new URL('../../../reference/glm/glm-reference.json', import.meta.url)), 'utf8'),
);

export function referenceCase(name: string): ReferenceCase {
  return REFERENCE.cases[name] as ReferenceCase;
}

/** Names of the cases that carry data (every one but the ungrouped summary). */
export const FITTED_CASES = Object.keys(REFERENCE.cases).filter((k) => 'data' in REFERENCE.cases[k]);

export function designOf(c: ReferenceCase, terms: Term[] = c.terms, data: Record<string, (number | string)[]> = c.data): DesignMatrix {
  const rows = [...data[c.response].keys()];
  const built = buildDesign(data as Columns, terms, true, rows);
  if ('issues' in built) throw new Error(built.issues[0].message);
  return built.design;
}

export function fitCase(c: ReferenceCase, terms: Term[] = c.terms): { fit: GlmFit; design: DesignMatrix } {
  const design = designOf(c, terms);
  const column = (name: string | null) => (name ? Float64Array.from(c.data[name] as number[]) : undefined);
  const fit = fitGlm({
    family: c.family, link: c.link, design,
    response: column(c.response)!, trials: column(c.trials), offset: column(c.offset),
  });
  if ('issues' in fit) throw new Error(fit.issues[0].message);
  return { fit, design };
}

/** |a - b| / |b|, or |a - b| when b is 0. */
export function relativeError(a: number | null, b: number): number {
  if (a === null) return Infinity;
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}

export function worstRelativeError(a: ArrayLike<number | null>, b: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < b.length; i++) worst = Math.max(worst, relativeError(a[i], b[i]));
  return worst;
}
