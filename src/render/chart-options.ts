// Query options of the chart, validated like any other input: every problem
// is reported as data (a path, a code and its facts), never thrown, so the
// HTTP layer can turn them into a 400 problem document.
import { isCriterionName } from './criteria.ts';
import { criterionNames, type CriterionName, type StoredComparisonView } from './types.ts';

export interface ChartOptions {
  criterion: CriterionName;
  width: number;
  /** null: as tall as the models need at a comfortable row height. */
  height: number | null;
}

export type ChartOptionIssue =
  | { path: string; code: 'unknown_option'; message: string; allowed: readonly string[] }
  | { path: string; code: 'repeated_option'; message: string }
  | { path: string; code: 'not_an_integer'; message: string; received: string }
  | { path: string; code: 'out_of_range'; message: string; received: number; min: number; max: number }
  | { path: string; code: 'unknown_size'; message: string; received: string; allowed: readonly string[] }
  | { path: string; code: 'unknown_criterion'; message: string; received: string; allowed: readonly string[] }
  | { path: string; code: 'criterion_not_ranked'; message: string; received: string; ranked: CriterionName[] }
  | { path: string; code: 'no_ranking'; message: string };

export type ChartOptionsResult = { ok: true; options: ChartOptions } | { ok: false; issues: ChartOptionIssue[] };

export const widthRange = { min: 240, max: 2400 } as const;
export const heightRange = { min: 160, max: 2400 } as const;

/**
 * Named sizes. `tile` fits a dashboard tile; `panel` is the default for a
 * page column; `print` fills the text width of an A4 or Letter page at
 * 96 px per inch. An explicit width or height overrides the preset's.
 */
export const sizePresets = {
  tile: { width: 420, height: 280 },
  panel: { width: 720, height: null },
  print: { width: 680, height: null },
  wide: { width: 1200, height: null },
} as const satisfies Record<string, { width: number; height: number | null }>;
export type SizePreset = keyof typeof sizePresets;

const optionNames = ['criterion', 'size', 'width', 'height'] as const;

/** The criteria the record actually ranked, in the contract's order. */
export function rankedCriteria(record: StoredComparisonView): CriterionName[] {
  const rankings = record.result?.rankings ?? {};
  return criterionNames.filter((c) => Array.isArray(rankings[c]) && (rankings[c]?.length ?? 0) > 0);
}

/**
 * The criteria the verdict counts (the keys of verdict.best, in the contract's
 * order), so the strip of preferred models and the verdict's sentence count
 * the same criteria and tell one story. A record without verdict.best: every
 * ranked criterion but leave-one-out, a check of prediction error that no
 * verdict counts.
 */
export function verdictCriteria(record: StoredComparisonView): CriterionName[] {
  const ranked = rankedCriteria(record);
  const best = record.result?.verdict?.best;
  if (best !== null && typeof best === 'object' && Object.keys(best).length > 0) {
    const counted = ranked.filter((c) => Object.hasOwn(best, c));
    if (counted.length > 0) return counted;
  }
  return ranked.filter((c) => c !== 'loo');
}

/** The criterion the record itself was ranked by, if it ranked by one it has. */
export function defaultCriterion(record: StoredComparisonView): CriterionName | null {
  const ranked = rankedCriteria(record);
  const rankBy = record.result?.verdict?.rankBy;
  if (isCriterionName(rankBy) && ranked.includes(rankBy)) return rankBy;
  return ranked[0] ?? null;
}

function singleValue(query: Record<string, unknown>, name: string, issues: ChartOptionIssue[]): string | undefined {
  const raw = query[name];
  if (raw === undefined) return undefined;
  if (Array.isArray(raw)) {
    issues.push({ path: name, code: 'repeated_option', message: `${name} may be given once` });
    return undefined;
  }
  return String(raw);
}

function integerInRange(
  text: string | undefined,
  name: string,
  range: { min: number; max: number },
  issues: ChartOptionIssue[],
): number | undefined {
  if (text === undefined) return undefined;
  if (!/^[0-9]{1,6}$/.test(text)) {
    issues.push({ path: name, code: 'not_an_integer', message: `${name} must be a whole number of pixels`, received: text });
    return undefined;
  }
  const value = Number(text);
  if (value < range.min || value > range.max) {
    issues.push({
      path: name,
      code: 'out_of_range',
      message: `${name} must be between ${range.min} and ${range.max}`,
      received: value,
      ...range,
    });
    return undefined;
  }
  return value;
}

/** Reads `criterion`, `size`, `width` and `height` from a parsed query string. */
export function parseChartOptions(query: Record<string, unknown>, record: StoredComparisonView): ChartOptionsResult {
  const issues: ChartOptionIssue[] = [];
  for (const key of Object.keys(query)) {
    if (!(optionNames as readonly string[]).includes(key)) {
      issues.push({ path: key, code: 'unknown_option', message: `unknown option ${key}`, allowed: optionNames });
    }
  }

  const sizeText = singleValue(query, 'size', issues);
  let preset: { width: number; height: number | null } = sizePresets.panel;
  if (sizeText !== undefined) {
    if (Object.hasOwn(sizePresets, sizeText)) preset = sizePresets[sizeText as SizePreset];
    else {
      issues.push({
        path: 'size',
        code: 'unknown_size',
        message: `size must be one of ${Object.keys(sizePresets).join(', ')}`,
        received: sizeText,
        allowed: Object.keys(sizePresets),
      });
    }
  }
  const width = integerInRange(singleValue(query, 'width', issues), 'width', widthRange, issues);
  const height = integerInRange(singleValue(query, 'height', issues), 'height', heightRange, issues);

  const ranked = rankedCriteria(record);
  const criterionText = singleValue(query, 'criterion', issues);
  let criterion: CriterionName | null = null;
  if (criterionText === undefined) {
    criterion = defaultCriterion(record);
    if (criterion === null) issues.push({ path: 'criterion', code: 'no_ranking', message: 'the record holds no ranking to draw' });
  } else if (!isCriterionName(criterionText)) {
    issues.push({
      path: 'criterion',
      code: 'unknown_criterion',
      message: `criterion must be one of ${criterionNames.join(', ')}`,
      received: criterionText,
      allowed: criterionNames,
    });
  } else if (!ranked.includes(criterionText)) {
    issues.push({
      path: 'criterion',
      code: 'criterion_not_ranked',
      message: `this comparison has no ${criterionText} ranking`,
      received: criterionText,
      ranked,
    });
  } else {
    criterion = criterionText;
  }

  if (issues.length > 0 || criterion === null) return { ok: false, issues };
  return { ok: true, options: { criterion, width: width ?? preset.width, height: height ?? preset.height } };
}
