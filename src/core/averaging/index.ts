export { averageModels, type AveragingInput, type AveragedTerm, type ModelAverage } from './model-average.ts';
export { averagePredictions, type AveragedPrediction, type PredictingModel } from './averaged-predictions.ts';
export { averageWithUnconditionalSe, ESTIMATOR_DESCRIPTION, type UnconditionalSeEstimator, type WeightedEstimate } from './unconditional-se.ts';
