// Generalised linear models: the public face of the kind. Fitting (IRLS on
// the least-squares engine's QR), scoring means fitted elsewhere, the
// statistics after the ranking, pricing and the convention in words.
export { FAMILY_NAMES, LINK_NAMES } from './types.ts';
export type {
  DistributionParameter, GlmCaution, GlmCoefficient, GlmConvergence, GlmFamilyName, GlmFit, GlmLinkName,
  GlmWorkingState, Measure,
} from './types.ts';
export { FAMILIES, resolveLink } from './families.ts';
export { LINKS } from './links.ts';
export { fitGlm, type GlmInput, type GlmOutcome } from './fit-glm.ts';
export type { GlmDataInput, GlmFieldPaths } from './support.ts';
export { familyLogLikelihood, logBinomialCoefficient } from './log-likelihood.ts';
export { scoreFittedMeans, type FittedMeansInput, type FittedMeansScore } from './fitted-means.ts';
export { glmResiduals, glmInfluence, overdispersion, type GlmInfluence, type GlmResiduals, type Overdispersion } from './after-ranking.ts';
export { predictGlm, type GlmPrediction, type GlmPredictionOptions, type ScaleEstimate } from './predict.ts';
export { glmNestedTest, glmNestingOrder, type GlmNestedCandidate, type GlmNestedTest } from './nested-tests.ts';
export { estimateCHat, quasiCriteria, type CHatEstimate, type QuasiCriteria } from './quasi-likelihood.ts';
export { priceGlm, priceGlmAfterRanking, type GlmShape } from './pricing.ts';
export { GLM_CONVENTIONS } from './conventions.ts';
export { CONVERGENCE_RULE, DEFAULT_MAX_ITERATIONS } from './irls.ts';
