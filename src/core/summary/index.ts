// Data summaries: reduce rows where they live, merge partial summaries, check a caller's, fit from one.
export type { DataSummary, SummaryIssue, SummaryIssueCode, SummaryWeights } from './types.ts';
export { summariseRows } from './summarise.ts';
export { mergeSummaries, type MergeOutcome } from './merge.ts';
export { validateSummary, SUMMARY_TOLERANCE } from './validate.ts';
export { fitFromSummary, type SummaryFit, type SummaryFitOutcome } from './fit.ts';
export { summaryModelResult, ROWS_UNAVAILABLE_CAUTION } from './summary-model.ts';
export { summaryIssues } from './as-issues.ts';
export { summaryFingerprint } from './fingerprint.ts';
export { summaryPredictors, summaryResponseIssues } from './summary-terms.ts';
