// Model averaging over the fitted candidates by the ranking criterion's weights
// (Burnham & Anderson 2002), in two parts with different reach:
//
// - Coefficients are averaged only over models on one response scale: a
//   coefficient of a model of log y and one of a model of y measure different
//   things, and so do coefficients of generalised linear models of another
//   family or link (each lives on its own link scale; a Gaussian identity
//   GLM is least squares). The scale holding the most weight is the one averaged (the
//   response as sent on a tie); `models` names the models averaged and
//   `weightCovered` their summed weight, and a caution says when it is below 1.
// - Predictions are averaged over every model that can predict, each taken
//   to the response's original scale first (the median; see
//   inference/back-transform.ts), so the winner is never left out for being a
//   model of log y. A GLM predicts its mean (the inverse link of its
//   link-scale interval): beside a model of a transformed response, which
//   predicts the median, a note says the average mixes the two.
//
// Models fitted elsewhere have neither coefficients nor predictions here.
// Coefficients are matched by design column key, not label (see
// design/column-identity.ts), so differently coded dummies are never pooled.
import { averageModels, averagePredictions, type AveragedPrediction, type ModelAverage } from '../../averaging/index.ts';
import { columnQualifier, keyReferences } from '../../design/index.ts';
import type { RankingCriterion } from '../../scoring/criteria.ts';
import type { ScaledPrediction } from '../../inference/prediction-intervals.ts';
import type { BandedEntry } from '../../scoring/rankings.ts';
import type { ModelResult } from '../../models/model-result.ts';
import type { ResponseTransformSpec } from '../../models/response-transform.ts';
import type { Caution } from '../../scoring/cautions.ts';
import { transformLabel } from '../../models/response-transform.ts';

export interface AveragedResult extends Omit<ModelAverage, 'issues'> {
  criterion: RankingCriterion;
  over: 'all' | 'confidenceSet';
  /** The scale of the averaged coefficients: null for the response as sent. */
  responseTransform: ResponseTransformSpec | null;
  /** The family and link of averaged GLM coefficients (their link scale); null for least-squares coefficients. */
  glm: { family: string; link: string } | null;
  /** Summed criterion weight of the models whose coefficients were averaged. */
  weightCovered: number;
  excluded: { name: string; reason: string }[];
  predictions: AveragedPrediction[];
  /** The models whose predictions were averaged and their summed weight; null without prediction rows. */
  predictionsOver: { models: string[]; weightCovered: number } | null;
  notes: string[];
}

export interface AveragingInput {
  models: readonly ModelResult[];
  ranking: readonly BandedEntry[];
  criterion: RankingCriterion;
  over: 'all' | 'confidenceSet';
  /** Each predicting model's predictions on its own scale, by name. */
  predictions: ReadonlyMap<string, readonly ScaledPrediction[]>;
  /** Design column keys per model name, in coefficient order. */
  keys: ReadonlyMap<string, readonly string[]>;
  intervalLevel: number;
}

/** A GLM's coefficients are on its link scale: only one family and link share them (the Gaussian identity GLM is least squares). */
const glmScale = (m: ModelResult) => (m.family && m.link && !(m.family === 'gaussian' && m.link === 'identity') ? { family: m.family, link: m.link } : null);

const scaleKey = (m: ModelResult) => {
  const glm = glmScale(m);
  if (glm) return JSON.stringify(glm);
  return m.responseTransform ? JSON.stringify({ fn: m.responseTransform.fn, lambda: m.responseTransform.lambda }) : 'response';
};

function scaleWords(m: ModelResult): string {
  const glm = glmScale(m);
  if (glm) return `the ${glm.link} link of a ${glm.family} mean`;
  const spec = specOf(m);
  return spec ? `${transformLabel(spec)}(response)` : 'the response as sent';
}

/** The transform spec without the Jacobian a model result carries. */
function specOf(m: ModelResult): ResponseTransformSpec | null {
  if (!m.responseTransform) return null;
  const { fn, lambda } = m.responseTransform;
  return lambda === undefined ? { fn } : { fn, lambda };
}

/** Why a model fitted here offers no coefficients to match by design column. */
function unmatchedCoefficientsReason(m: ModelResult): string {
  if (m.expression !== undefined) return 'a nonlinear model: its parameters are not coefficients of design columns';
  return 'its design columns carry no identity to match coefficients by';
}

export function averagedModels(input: AveragingInput): AveragedResult | null {
  const { models, ranking, criterion, over } = input;
  const byName = new Map(ranking.map((e) => [e.name, e]));
  const weightOf = (m: ModelResult) => byName.get(m.name)?.weight ?? null;
  const excluded: { name: string; reason: string }[] = [];
  // Models that take part at all: fitted here, weighted, inside the set asked for.
  const eligible: ModelResult[] = [];
  for (const m of models) {
    const entry = byName.get(m.name);
    if (m.source === 'lifetime') excluded.push({ name: m.name, reason: 'a life distribution: its coefficients move the location of (log) time, not the mean of the response, so they are not averaged with others' });
    else if (m.source !== 'fit') excluded.push({ name: m.name, reason: 'fitted elsewhere: no coefficients or predictions to average' });
    else if (!entry || entry.weight === null) excluded.push({ name: m.name, reason: `no ${criterion} weight` });
    else if (over === 'confidenceSet' && !entry.inConfidenceSet) excluded.push({ name: m.name, reason: 'outside the confidence set' });
    else eligible.push(m);
  }
  if (eligible.length === 0) return null;

  // The scale holding the most weight; the response as sent wins a tie.
  const byScale = new Map<string, ModelResult[]>();
  for (const m of eligible) byScale.set(scaleKey(m), [...(byScale.get(scaleKey(m)) ?? []), m]);
  const sum = (ms: readonly ModelResult[]) => ms.reduce((s, m) => s + (weightOf(m) ?? 0), 0);
  let chosenKey = byScale.has('response') ? 'response' : [...byScale.keys()][0];
  for (const [key, ms] of byScale) if (sum(ms) > sum(byScale.get(chosenKey)!)) chosenKey = key;
  const chosen: ModelResult[] = [];
  for (const m of byScale.get(chosenKey)!) {
    if (input.keys.get(m.name)?.length !== m.coefficients.length) {
      excluded.push({ name: m.name, reason: unmatchedCoefficientsReason(m) });
    } else chosen.push(m);
  }
  const representative = byScale.get(chosenKey)![0];
  const scale = specOf(representative);
  const coefficientGlm = glmScale(representative);
  for (const m of eligible) {
    if (scaleKey(m) !== chosenKey) {
      excluded.push({
        name: m.name,
        reason: `describes ${scaleWords(m)}, while the averaged coefficients are of ${scaleWords(representative)} (the scale holding the most weight); its coefficients measure something else${input.predictions.has(m.name) ? ', but its predictions are averaged on the original scale' : ''}`,
      });
    }
  }

  const average = averageModels(chosen.map((m) => {
    const k = input.keys.get(m.name)!;
    return {
      name: m.name,
      weight: weightOf(m)!,
      coefficients: m.coefficients.map((c, j) => ({ term: c.term, estimate: c.estimate, standardError: c.standardError, key: k[j], qualifier: columnQualifier(k[j]) })),
    };
  }));
  const { issues, ...rest } = average;
  const notes = issues.map((i) => i.message);
  const mixed = mixedReferences(chosen.map((m) => ({ name: m.name, keys: input.keys.get(m.name)! })));
  if (mixed) notes.push(mixed);

  const predicting = eligible.filter((m) => input.predictions.has(m.name));
  const predicted = predicting.length > 0
    ? averagePredictions(predicting.map((m) => ({ name: m.name, weight: weightOf(m)!, predictions: input.predictions.get(m.name)! })), input.intervalLevel)
    : null;
  if (predicted) notes.push(...predicted.issues.map((i) => i.message));
  if (predicting.some((m) => m.responseTransform) && predicting.some((m) => glmScale(m) && m.link !== 'identity')) {
    notes.push('The averaged predictions mix medians (models of a transformed response, taken back to its scale) with means (generalised linear models, through their inverse link); for a skewed response the two differ, so read the average as a central value rather than a mean.');
  }
  return {
    ...rest,
    criterion,
    over,
    responseTransform: scale,
    glm: coefficientGlm,
    weightCovered: sum(chosen),
    excluded,
    predictions: predicted?.predictions ?? [],
    predictionsOver: predicted ? { models: predicting.map((m) => m.name), weightCovered: sum(predicting) } : null,
    notes,
  };
}

/**
 * Said when the average leaves out weight: the averaged coefficients (or
 * predictions) then speak only for part of the evidence.
 */
export function averagingCautions(averaged: AveragedResult | null, ranking: readonly BandedEntry[]): Caution[] {
  if (!averaged) return [];
  const out: Caution[] = [];
  const weighted = ranking.filter((e) => e.weight !== null && e.weight > 0);
  const share = (w: number) => (w >= 0.9995 && w < 1 ? 'just under 1' : w.toPrecision(3));
  const leftOut = (names: readonly string[]) => weighted.filter((e) => !names.includes(e.name)).map((e) => JSON.stringify(e.name));
  const coefficientsMiss = leftOut(averaged.models);
  if (coefficientsMiss.length > 0) {
    out.push({
      code: 'averaged_coefficients_partial',
      message: `The averaged coefficients cover models holding ${share(averaged.weightCovered)} of the ${averaged.criterion} weight; ${coefficientsMiss.join(', ')} ${coefficientsMiss.length === 1 ? 'is' : 'are'} left out (averaged.excluded says why), so the averaged coefficients speak only for ${averaged.models.map((n) => JSON.stringify(n)).join(', ') || 'no model'}.`,
    });
  }
  const p = averaged.predictionsOver;
  const predictionsMiss = p ? leftOut(p.models) : [];
  if (p && predictionsMiss.length > 0) {
    out.push({
      code: 'averaged_predictions_partial',
      message: `The averaged predictions cover models holding ${share(p.weightCovered)} of the ${averaged.criterion} weight; ${predictionsMiss.join(', ')} offer no predictions to average (fitted elsewhere, a kind whose predictions are not averaged here, or outside the averaged set).`,
    });
  }
  return out;
}

/**
 * A factor coded against different reference levels in different averaged
 * models changes the meaning of more than its dummies: the intercept (and the
 * slope of any term that interacts with the factor) is measured at the
 * reference level, so those averages mix quantities too. Said in a note.
 */
function mixedReferences(models: readonly { name: string; keys: readonly string[] }[]): string | null {
  const byColumn = new Map<string, Map<string, Set<string>>>();
  for (const m of models) {
    for (const key of m.keys) {
      for (const { column, reference } of keyReferences(key)) {
        if (!byColumn.has(column)) byColumn.set(column, new Map());
        const refs = byColumn.get(column)!;
        if (!refs.has(reference)) refs.set(reference, new Set());
        refs.get(reference)!.add(m.name);
      }
    }
  }
  const parts: string[] = [];
  for (const [column, refs] of byColumn) {
    if (refs.size < 2) continue;
    const codings = [...refs].map(([ref, names]) => `against ${JSON.stringify(ref)} in ${[...names].map((n) => JSON.stringify(n)).join(', ')}`);
    parts.push(`${JSON.stringify(column)} is coded ${codings.join('; ')}`);
  }
  if (parts.length === 0) return null;
  return `${parts.join('. ')}. The intercept, and the slope of any term that interacts with such a factor, is measured at the reference level, so its averaged value mixes different quantities; give every candidate the same reference to average them.`;
}
