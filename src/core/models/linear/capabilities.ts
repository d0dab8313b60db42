// What a least-squares model offers after the ranking. One factorisation of
// its design (the geometry: R factor and leverages) serves the checks and the
// predictions, made on first use and kept.
import { LEAST_SQUARES_NESTING } from '../../inference/nested.ts';
import { modelGeometry, type ModelGeometry } from '../../inference/model-geometry.ts';
import { predictionDesign } from '../../comparison/extras/prediction-rows.ts';
import type { ModelCapabilities } from '../scored-model.ts';
import type { FittedModel } from './fitted-model.ts';
import type { FittedCandidateInput } from './fitted-model.ts';
import { modelChecks } from './model-checks.ts';
import { modelPredictions } from './model-predictions.ts';

export function leastSquaresCapabilities(
  model: FittedModel,
  candidate: FittedCandidateInput,
  index: number,
  weights: Float64Array | undefined,
): ModelCapabilities {
  let geometry: ModelGeometry | null = null;
  const geometryOnce = () => (geometry ??= modelGeometry(model.fit, model.design, weights));
  return {
    checks: (rows) => modelChecks(model, rows, weights, geometryOnce()),
    predict: (at) => {
      const built = predictionDesign(at.columns, at.rows, at.predict, at.count, candidate.terms, candidate.intercept, index);
      if ('issues' in built) return built;
      return modelPredictions(model, built.design, weights, at.newWeights, at.intervalLevel, geometryOnce());
    },
    nested: (sample) => ({
      candidate: { name: model.result.name, keys: model.design.keys ?? null, fit: model.fit, sample: `${sample}|${JSON.stringify(candidate.response ?? null)}` },
      rules: LEAST_SQUARES_NESTING,
    }),
    ...(model.design.keys ? { columnKeys: model.design.keys } : {}),
  };
}
