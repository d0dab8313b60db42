// Lifetime distributions and censored observations: the kind's one public face.
export {
  CENSORING_STATUSES, EXACT, RIGHT, LEFT, INTERVAL, censoredResponse, uncensoredResponse, isCensored, censoringCounts,
  type CensoredResponse, type CensoringColumns, type CensoringCounts, type CensoringStatus,
} from './censoring.ts';
export { DISTRIBUTION_NAMES, DISTRIBUTIONS, isDistributionName, isPositiveTime, type DistributionName } from './distributions.ts';
export { fitLifetime, type LifetimeCandidate } from './fit-lifetime.ts';
export type { LifetimeFit } from './lifetime-result.ts';
export { checkLifetimeOptions, DEFAULT_INTERVAL_LEVEL, DEFAULT_MAX_ITERATIONS, type LifetimeOptions } from './options.ts';
export type { LifePercentile, LifeSurvival, LifetimeEstimates } from './life-quantities.ts';
export { predictLifetime, coxSnellResiduals, fittedDistributionCurve, type LifetimeRowPrediction, type LifetimePredictionRequest } from './lifetime-predict.ts';
export { lifetimeNestedTests, lifetimeNestingOrder, nestingCandidateOf, type LifetimeLikelihoodRatioTest, type LifetimeNestingCandidate } from './nested.ts';
export { nonparametricEstimate, kaplanMeier, turnbull, type KaplanMeierEstimate, type TurnbullEstimate } from './nonparametric/index.ts';
export { priceLifetime, priceNonparametric, type LifetimeShape } from './pricing.ts';
export { LIFETIME_CONVENTIONS } from './conventions.ts';
export { lifePicture, pictureAxis, PICTURE_NOTES, PICTURE_POINTS, PICTURE_RISE, type LifePicture, type LifeCurve, type StoredKaplanMeier, type StoredTurnbull } from './life-picture.ts';
export { priceLifePicture } from './pricing.ts';
