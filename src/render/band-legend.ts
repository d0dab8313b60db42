// The chart's band legend and zones for one ranking of one record. The legend
// must say what the bars' words say, so its wording follows the record:
// - every entry's band is the default policy's wording for its Δ: the legend
//   lists the default policy's bands (the same edges as our reference lines);
// - the entries carry other words (a team policy of its own, whose edges the
//   record does not hold): the legend names the lines only and says whose
//   words the bars carry, rather than pairing our edges with its words;
// - no entry carries a band (records older than bands): our own wording.
import { DEFAULT_POLICY, deltaBand, type DeltaBand } from '../core/scoring/policy.ts';
import { bandFamily, ownBands, referenceLines, type BandFamily, type BandRule } from './delta-bands.ts';
import type { CriterionName, StoredComparisonView } from './types.ts';

export interface BandLegend {
  family: BandFamily;
  lines: readonly number[];
  /** The bands whose zones the chart shades (edges shared by every source of wording). */
  rules: readonly BandRule[];
  /** Whose words the legend (and the bars) use. */
  words: 'default-policy' | 'team-policy' | 'own';
  text: string;
}

const policyBands: Record<BandFamily, readonly DeltaBand[]> = {
  akaike: DEFAULT_POLICY.akaikeBands,
  bic: DEFAULT_POLICY.bicBands,
};

/** The default policy's bands with our keys and shades, when their edges are ours; else null. */
function defaultPolicyRules(family: BandFamily): BandRule[] | null {
  const own = ownBands[family];
  const policy = policyBands[family];
  if (own.length !== policy.length) return null;
  const same = own.every((rule, i) => rule.maxDelta === policy[i].maxDelta && rule.includeMax === policy[i].includeMax);
  return same ? own.map((rule, i) => ({ ...rule, wording: policy[i].wording })) : null;
}

function formatEdge(x: number): string {
  return String(x);
}

/** "Δ ≤ 2", "2 < Δ < 4", "4 ≤ Δ ≤ 7", "Δ > 10": each band's range in the policy's edge rule. */
export function bandRange(rules: readonly BandRule[], index: number): string {
  const rule = rules[index];
  const previous = index > 0 ? rules[index - 1] : null;
  const lower = previous === null || previous.maxDelta === null ? null : `${formatEdge(previous.maxDelta)} ${previous.includeMax ? '<' : '≤'} `;
  if (rule.maxDelta === null) return previous?.maxDelta == null ? 'any Δ' : `Δ ${previous.includeMax ? '>' : '≥'} ${formatEdge(previous.maxDelta)}`;
  return `${lower ?? ''}Δ ${rule.includeMax ? '≤' : '<'} ${formatEdge(rule.maxDelta)}`;
}

function listOfNumbers(values: readonly number[]): string {
  const words = values.map(formatEdge);
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** "Δ ≤ 2: … · 2 < Δ < 4: … · …": every band with its range. */
export function describeBands(rules: readonly BandRule[]): string {
  // No-break spaces inside a range and before each separator, so a wrapped
  // legend never parts "7 < Δ ≤ 10" or starts a line with "·".
  return rules.map((rule, i) => `${bandRange(rules, i).replace(/ /g, '\u00a0')}: ${rule.wording}`).join('\u00a0· ');
}

function quotedPolicyName(record: StoredComparisonView): string {
  const name = record.result.policy?.name;
  return typeof name === 'string' && name !== '' ? `policy “${name}”` : 'the team policy';
}

export function bandLegend(record: StoredComparisonView, criterion: CriterionName): BandLegend | null {
  const family = bandFamily(criterion);
  if (family === null) return null;
  const lines = referenceLines[family];
  const drawn = `Dashed lines at Δ ${listOfNumbers(lines)}.`;
  const entries = record.result.rankings?.[criterion] ?? [];
  const carried = entries.filter((e) => typeof e.band === 'string' && e.band !== '');

  if (carried.length === 0) {
    return { family, lines, rules: ownBands[family], words: 'own', text: `${drawn} ${describeBands(ownBands[family])}.` };
  }
  const policyRules = defaultPolicyRules(family);
  const matchesDefault =
    policyRules !== null &&
    carried.every((e) => typeof e.delta === 'number' && e.band === deltaBand(e.delta, criterion as Parameters<typeof deltaBand>[1], DEFAULT_POLICY));
  if (matchesDefault) {
    return { family, lines, rules: policyRules, words: 'default-policy', text: `${drawn} In the words of ${quotedPolicyName(record)}: ${describeBands(policyRules)}.` };
  }
  return {
    family,
    lines,
    rules: ownBands[family],
    words: 'team-policy',
    text: `${drawn} The words beside the bars are those of ${quotedPolicyName(record)}, whose band edges may differ from these lines.`,
  };
}
