// The verdict over all criteria: do they pick the same model, and if not,
// which way each leans and what the ranking criterion of the request chose.
// The criteria differ mainly in what they charge for an added parameter, in
// units of -2 log L: adjusted R² rises whenever the added terms' F statistic
// exceeds 1, which works out to about n/(n-p) ≈ 1 per parameter, a lighter
// charge than AIC's 2; AICc adds a small-sample
// correction to AIC's 2; HQC charges 2 ln(ln n) (above 2 once n ≥ 16); BIC
// charges ln n (above 2 once n ≥ 8, and always above HQC). These are facts
// of the trade (common practice); the summary states them only as far as
// they hold at the given n. QAIC and QAICc, when the comparison has a ĉ,
// count like the others: they charge 2 per parameter on −2 log L / ĉ, that
// is 2ĉ in units of −2 log L (Burnham & Anderson 2002, §2.5), and a verdict
// whose criteria "agree" must agree with them too — when the counts are
// overdispersed they are the criteria that matter most.

import { CRITERIA, QUASI_CRITERIA, rankingCriterionInfo, type CriterionName, type QuasiCriterionName, type RankingCriterion } from './criteria.ts';
import type { RankingEntry } from './ranking.ts';

export interface VerdictContext {
  /** Parameter count k of each model by name, to state in the reasoning. */
  parameters?: Readonly<Record<string, number | null | undefined>>;
  /** Rows used by the comparison, so that the reasoning can be exact about ln n. */
  observations?: number | null;
  /** The comparison's ĉ when it ranks by QAIC and QAICc, so that their charge can be stated. */
  cHat?: number | null;
}

export interface Leaning {
  model: string;
  parameters: number | null;
  criteria: RankingCriterion[];
}

export interface Verdict {
  /** True when every criterion that could rank a model picks the same one (QAIC and QAICc included when ranked). */
  agree: boolean;
  /** The best model under each criterion; null where it ranked none (or was not given). QAIC and QAICc only when ranked. */
  best: Record<CriterionName, string | null> & Partial<Record<QuasiCriterionName, string | null>>;
  rankBy: RankingCriterion;
  /** The best model under rankBy; null when rankBy ranked none. */
  chosen: string | null;
  summary: string;
  /** The picks grouped by model, most parameters first. */
  leanings: Leaning[];
  /** Criteria on which two or more models tie for first, with the tied names. */
  tiesForFirst: Partial<Record<RankingCriterion, string[]>>;
}

const NUMBER_WORDS: Record<number, string> = { 2: 'two', 3: 'three', 4: 'four', 5: 'five', 6: 'six', 7: 'seven', 8: 'eight' };

function inWords(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function labels(names: RankingCriterion[]): string {
  return inWords(names.map((c) => rankingCriterionInfo(c).label));
}

function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

function modelText(model: string, k: number | null, short = false): string {
  if (k === null) return JSON.stringify(model);
  return short ? `${JSON.stringify(model)} (${k})` : `${JSON.stringify(model)} (${k} parameter${k === 1 ? '' : 's'})`;
}

/**
 * What each criterion present charges per added parameter, lightest first, and
 * which way that makes it lean. With n known the figures are exact at n (so a
 * small sample where BIC charges less than AIC is stated as such).
 */
function leaningSentence(present: Set<RankingCriterion>, n: number | null, cHat: number | null): string | null {
  const known = n !== null && n > 1;
  const charges: { name: RankingCriterion; text: string; order: number }[] = [];
  const fmt = (x: number) => x.toFixed(2);
  if (present.has('adjustedR2')) charges.push({ name: 'adjustedR2', text: 'adjusted R² about n/(n - p), near 1 unless n is small', order: 1 });
  if (present.has('aic')) charges.push({ name: 'aic', text: 'AIC 2', order: 2 });
  if (present.has('aicc')) charges.push({ name: 'aicc', text: 'AICc a little over 2', order: 2.0001 });
  if (present.has('hqc')) {
    const c = known ? 2 * Math.log(Math.log(n)) : 2.5;
    charges.push({ name: 'hqc', text: known ? `HQC 2 ln(ln n) = ${fmt(c)}` : 'HQC 2 ln(ln n)', order: c });
  }
  if (present.has('bic')) {
    const c = known ? Math.log(n) : 3;
    charges.push({ name: 'bic', text: known ? `BIC ln n = ${fmt(c)}` : 'BIC ln n', order: c });
  }
  // ĉ scales −2 log L down, so 2 per parameter on that scale is 2ĉ on the others'.
  const c2 = cHat !== null && Number.isFinite(cHat) && cHat > 0 ? 2 * cHat : null;
  if (present.has('qaic')) charges.push({ name: 'qaic', text: c2 === null ? 'QAIC 2ĉ' : `QAIC 2ĉ = ${fmt(c2)}`, order: c2 ?? 2 });
  if (present.has('qaicc')) charges.push({ name: 'qaicc', text: c2 === null ? 'QAICc a little over 2ĉ' : `QAICc a little over ${fmt(c2)}`, order: (c2 ?? 2) + 0.0001 });
  if (charges.length < 2) return null;
  charges.sort((a, b) => a.order - b.order);
  return `What each charges for an added parameter, in units of -2 log L${known ? ` at n = ${n}` : ''}: ${inWords(charges.map((c) => c.text))}; the heavier the charge, the smaller the model it leans toward.`;
}

export function verdict(
  rankings: Partial<Record<RankingCriterion, readonly RankingEntry[]>>,
  rankBy: RankingCriterion = 'aicc',
  context: VerdictContext = {},
): Verdict {
  const kOf = (model: string): number | null => {
    const k = context.parameters?.[model];
    return typeof k === 'number' && Number.isFinite(k) ? k : null;
  };
  const best = {} as Verdict['best'];
  const tiesForFirst: Partial<Record<RankingCriterion, string[]>> = {};
  const ranked: RankingCriterion[] = [];
  const unranked: RankingCriterion[] = [];
  // The quasi criteria count only in a comparison that ranked them (one with a ĉ).
  const considered: RankingCriterion[] = [...CRITERIA.map((c) => c.name), ...QUASI_CRITERIA.map((c) => c.name).filter((c) => rankings[c] !== undefined)];
  for (const name of considered) {
    const list = rankings[name];
    const first = list?.filter((e) => e.rank === 1) ?? [];
    best[name] = first.length > 0 ? first[0].name : null;
    if (first.length > 1) tiesForFirst[name] = first.map((e) => e.name);
    if (first.length > 0) ranked.push(name);
    else if (list) unranked.push(name);
  }

  const groups = new Map<string, RankingCriterion[]>();
  for (const c of ranked) groups.set(best[c]!, [...(groups.get(best[c]!) ?? []), c]);
  const leanings: Leaning[] = [...groups].map(([model, criteria]) => ({ model, parameters: kOf(model), criteria }));
  leanings.sort((a, b) => (b.parameters ?? -Infinity) - (a.parameters ?? -Infinity));

  const agree = leanings.length === 1;
  const chosen = best[rankBy] ?? null;
  const rankByLabel = rankingCriterionInfo(rankBy).label;
  const sentences: string[] = [];

  if (leanings.length === 0) {
    sentences.push('No criterion could rank any model, so there is no pick.');
  } else if (agree) {
    const { model, criteria } = leanings[0];
    const who = criteria.length === considered.length ? `All ${NUMBER_WORDS[considered.length] ?? considered.length} criteria pick` : `${capitalised(labels(criteria))} ${criteria.length === 1 ? 'picks' : 'all pick'}`;
    sentences.push(`${who} ${modelText(model, kOf(model))}.`);
  } else {
    const picks = leanings.map(
      (l, i) => `${labels(l.criteria)} ${l.criteria.length === 1 ? 'picks' : 'pick'} ${modelText(l.model, l.parameters, i > 0)}`,
    );
    sentences.push(`The criteria disagree: ${picks.join('; ')}.`);
    const lean = leaningSentence(new Set(ranked), context.observations ?? null, context.cHat ?? null);
    if (lean) sentences.push(lean);
  }
  if (unranked.length > 0) {
    sentences.push(`${capitalised(labels(unranked))} could not rank any model (see the cautions).`);
  }
  for (const [c, names] of Object.entries(tiesForFirst) as [RankingCriterion, string[]][]) {
    sentences.push(`On ${rankingCriterionInfo(c).label}, ${inWords(names.map((n) => JSON.stringify(n)))} tie for first.`);
  }
  if (!agree && leanings.length > 0) {
    sentences.push(chosen === null
      ? `${rankByLabel}, the criterion this comparison ranks by, ranks no model, so none is chosen.`
      : `Ranked by ${rankByLabel}, the criterion this comparison uses, the choice is ${JSON.stringify(chosen)}.`);
  } else if (agree && chosen === null) {
    sentences.push(`${rankByLabel}, the criterion this comparison ranks by, ranks no model, so none is chosen.`);
  }

  return { agree, best, rankBy, chosen, summary: sentences.join(' '), leanings, tiesForFirst };
}
