// The design module's public face: columns and common rows, term validation
// and design matrices, response and weights on the common rows.
export { checkColumns, columnKind, columnsUsedBy, commonRows, unknownColumn, type ColumnKind } from './columns.ts';
export { isMissingMarker, nearestName, numbersWrittenAsText, readsAsNumber } from './text-values.ts';
export { buildDesign } from './build-design.ts';
export { factorCoding, factorLevels, type FactorCoding, type FactorDummy } from './factor-coding.ts';
export { INTERCEPT_LABEL, termLabel } from './labels.ts';
export { responseValues, weightValues } from './response.ts';
export { compareCodePoints } from './code-point-order.ts';
export { columnKey, columnQualifier, keyKind, keyReferences, type ColumnIdentity } from './column-identity.ts';
export { sampleRows, type SampleRows } from './sample-rows.ts';
