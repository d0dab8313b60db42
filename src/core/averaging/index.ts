export { averageModels, type AveragingInput, type AveragedTerm, type AveragedPrediction, type ModelAverage } from './model-average.ts';
export { averageWithUnconditionalSe, ESTIMATOR_DESCRIPTION, type UnconditionalSeEstimator, type WeightedEstimate } from './unconditional-se.ts';
