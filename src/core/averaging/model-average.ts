// Model-averaged coefficients over a set of fitted models
// with criterion weights (Akaike weights for AIC/AICc; the same form over
// BIC). The caller chooses the set (all candidates or the confidence set);
// weights are renormalised over the models passed in.
//
// Two averages per term, both reported:
// - full average (the headline `estimate`): a model without the term counts
//   with coefficient 0 and variance 0. It is the average that matches the
//   averaged prediction, since sum w_i x'b_i = x' (sum w_i b_i).
// - over the models containing the term: weights renormalised over those
//   models only; it answers "how large is the effect, given it is present".
// importance = summed (normalised) weight of the models containing the term.
// A "term" here is one design column identity (its key, factor reference
// included), not a label: kiln=west against east and kiln=west against
// north are different coefficients and are never pooled. When models code
// one label differently, each coding is reported as its own term, labelled
// "kiln=west (reference east)", and a note names the models — rather than
// dropping the term, since each coding's average is meaningful on its own.
// A coefficient that a model has but could not estimate (aliased) counts as
// absent: the fit set it to zero, which is what the full average uses anyway.
import { averageWithUnconditionalSe, ESTIMATOR_DESCRIPTION, type UnconditionalSeEstimator } from './unconditional-se.ts';
import type { StatisticsIssue } from '../inference/issue.ts';

export interface AveragingInput {
  name: string;
  weight: number;
  /**
   * Coefficients by design column: `term` is the label, `key` its identity
   * (defaults to the label) and `qualifier` the words that tell it from
   * another column with the same label (e.g. "reference east").
   */
  coefficients: ReadonlyArray<{ term: string; key?: string; qualifier?: string; estimate: number | null; standardError: number | null }>;
}

export interface AveragedTerm {
  term: string;
  importance: number;
  /** Full average: zero where the term is absent. */
  estimate: number;
  unconditionalStandardError: number | null;
  overModelsWithTerm: { estimate: number; unconditionalStandardError: number | null };
}

export interface ModelAverage {
  models: string[];
  estimator: UnconditionalSeEstimator;
  estimatorDescription: string;
  averages: { estimate: string; overModelsWithTerm: string };
  terms: AveragedTerm[];
  issues: StatisticsIssue[];
}

export function averageModels(
  models: readonly AveragingInput[],
  estimator: UnconditionalSeEstimator = 'eq6.12',
): ModelAverage {
  const issues: StatisticsIssue[] = [];
  const total = models.reduce((s, m) => s + (m.weight > 0 ? m.weight : 0), 0);
  const result: ModelAverage = {
    models: models.map((m) => m.name),
    estimator,
    estimatorDescription: ESTIMATOR_DESCRIPTION[estimator],
    averages: {
      estimate: 'over all averaged models, with the coefficient taken as zero where a model lacks the term',
      overModelsWithTerm: 'over the models containing the term only, weights renormalised over them',
    },
    terms: [],
    issues,
  };
  if (!(total > 0) || models.some((m) => !(m.weight >= 0) || !Number.isFinite(m.weight))) {
    issues.push({
      code: 'averaging-weights-invalid',
      message: 'Model averaging needs finite, non-negative weights with a positive sum.',
      facts: { models: models.length, weightSum: Number.isFinite(total) ? total : null },
    });
    return result;
  }
  const order: string[] = [];
  const present = new Map<string, Map<number, { estimate: number; standardError: number | null }>>();
  const seen = new Map<string, { label: string; qualifier: string; models: string[] }>();
  models.forEach((m, index) => {
    for (const c of m.coefficients) {
      const key = c.key ?? c.term;
      if (!seen.has(key)) seen.set(key, { label: c.term, qualifier: c.qualifier ?? key, models: [] });
      seen.get(key)!.models.push(m.name);
      if (c.estimate === null) continue;
      if (!present.has(key)) {
        present.set(key, new Map());
        order.push(key);
      }
      present.get(key)!.set(index, { estimate: c.estimate, standardError: c.standardError });
    }
  });
  const termNames = distinctTermNames(seen, issues);
  for (const key of order) {
    const term = termNames.get(key)!;
    const byModel = present.get(key)!;
    const full = models.map((m, index) => {
      const c = byModel.get(index);
      return { weight: m.weight, estimate: c ? c.estimate : 0, standardError: c ? c.standardError : 0 };
    });
    const containing = [...byModel].map(([index, c]) => ({ weight: models[index].weight, ...c }));
    const fullAverage = averageWithUnconditionalSe(full, estimator)!;
    const importance = containing.reduce((s, c) => s + c.weight, 0) / total;
    const conditional = averageWithUnconditionalSe(containing, estimator) ??
      // All models containing the term have weight 0: no conditional average exists beyond the plain one.
      { estimate: containing.reduce((s, c) => s + c.estimate, 0) / containing.length, unconditionalStandardError: null };
    result.terms.push({
      term,
      importance,
      estimate: fullAverage.estimate,
      unconditionalStandardError: fullAverage.unconditionalStandardError,
      overModelsWithTerm: conditional,
    });
  }
  return result;
}

/**
 * The reported name of each column identity: its label, or, when several
 * identities share that label, "label (qualifier)" — with a note naming the
 * models behind each coding.
 */
function distinctTermNames(
  seen: ReadonlyMap<string, { label: string; qualifier: string; models: string[] }>,
  issues: StatisticsIssue[],
): Map<string, string> {
  const byLabel = new Map<string, string[]>();
  for (const [key, s] of seen) byLabel.set(s.label, [...(byLabel.get(s.label) ?? []), key]);
  const names = new Map<string, string>();
  const taken = new Set<string>();
  for (const [label, keys] of byLabel) {
    if (keys.length === 1) {
      names.set(keys[0], label);
      taken.add(label);
    }
  }
  for (const [label, keys] of byLabel) {
    if (keys.length === 1) continue;
    const codings: string[] = [];
    for (const key of keys) {
      const s = seen.get(key)!;
      let name = `${label} (${s.qualifier})`;
      // Two columns alike in label and qualifier: number them so none is lost.
      for (let k = 2; taken.has(name); k++) name = `${label} (${s.qualifier}) #${k}`;
      taken.add(name);
      names.set(key, name);
      codings.push(`${s.models.map((m) => JSON.stringify(m)).join(', ')}: ${name}`);
    }
    issues.push({
      code: 'averaging-term-coded-differently',
      message: `The column labelled ${JSON.stringify(label)} means different things in different models (${codings.join('; ')}), so each version is averaged on its own and never pooled.`,
      facts: { label, codings: keys.length },
    });
  }
  return names;
}
