// Small data sets built in the tests, and a one-call fit on them.
import { buildDesign } from '../../../../src/core/design/index.ts';
import { fitGlm, type GlmFamilyName, type GlmLinkName, type GlmOutcome } from '../../../../src/core/models/glm/index.ts';
import type { Columns, DesignMatrix, Term } from '../../../../src/core/types.ts';

export function design(columns: Record<string, (number | string)[]>, terms: Term[], intercept = true): DesignMatrix {
  const n = Object.values(columns)[0].length;
  const built = buildDesign(columns as Columns, terms, intercept, [...Array(n).keys()]);
  if ('issues' in built) throw new Error(built.issues[0].message);
  return built.design;
}

export interface QuickFit {
  columns: Record<string, (number | string)[]>;
  terms: Term[];
  family: GlmFamilyName;
  link?: GlmLinkName;
  y: number[];
  trials?: number[];
  offset?: number[];
  weights?: number[];
  intercept?: boolean;
}

export function quickFit(q: QuickFit): GlmOutcome {
  const f = (v?: number[]) => (v ? Float64Array.from(v) : undefined);
  return fitGlm({
    family: q.family, link: q.link, design: design(q.columns, q.terms, q.intercept ?? true),
    response: Float64Array.from(q.y), trials: f(q.trials), offset: f(q.offset), weights: f(q.weights),
    at: ['candidates', 0],
  });
}
