// The renderers' one public face: pure functions from a stored record to
// SVG or HTML text. The HTTP routes call these; nothing here knows HTTP.
export { parseChartOptions, rankedCriteria, defaultCriterion, sizePresets, widthRange, heightRange } from './chart-options.ts';
export type { ChartOptions, ChartOptionIssue, ChartOptionsResult, SizePreset } from './chart-options.ts';
export { renderChartSvg, chartDescription, chartTitle, chartContentSecurityPolicy } from './chart-svg.ts';
export { renderReportHtml, reportContentSecurityPolicy, jobSentence } from './report-html.ts';
export type { ReportOptions } from './report-html.ts';
export { defaultChainVerification } from './report-chain.ts';
export type { ChainVerification } from './report-chain.ts';
export { standingCaution } from './report-extras.ts';
export { ownBands, referenceLines, bandFamily, bandOf, supportBandOf, bandsApply, entryBandWording } from './delta-bands.ts';
export type { BandFamily, BandRule } from './delta-bands.ts';
export { bandLegend } from './band-legend.ts';
export type { BandLegend } from './band-legend.ts';
export { escapeText, escapeAttribute, toCarriableText } from './escape.ts';
export type { StoredComparisonView, ComparisonResultView, ModelView, RankingEntry, CriterionName } from './types.ts';
export { criterionNames } from './types.ts';
export { storedComparisonView } from './stored-view.ts';
export { storedLifePicture } from './life-view.ts';
export { renderLifeChartSvg } from './life-chart.ts';
export { REPORT_ROW_LIMITS } from './bounded-rows.ts';
export type { StoredRecordLike } from './stored-view.ts';
export { storedSearchView } from './search-view.ts';
export type { StoredSearchView, SearchFacts } from './search-view.ts';
export { renderSearchReportHtml, searchSentence, SEARCH_REPORT_ROW_LIMITS } from './search-report.ts';
