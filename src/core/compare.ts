// The core's comparison entry point (see comparison/).
export { compareModels, type CandidateInput, type ComparisonInput, type ComparisonOutcome } from './comparison/compare.ts';
export { CONVENTIONS_VERSION } from './comparison/conventions.ts';
