// Every kind of candidate, in one table keyed by the candidate's form: how its
// candidates are scored into ScoredModels on the comparison's sample, and
// what each costs before anything is allocated. Adding a kind is one entry
// here, its folder under models/, its request schema and its tests (see
// DEVELOPERS.md, "Adding a kind of model").
import type { Issue } from '../issues.ts';
import type { Columns } from '../types.ts';
import { scoredElsewhere, type CandidateContext, type CandidateCost } from '../pricing/candidate-cost.ts';
import { scoreExternalCandidate, type ExternalCandidateInput } from './external/external-model.ts';
import { fitAll } from './linear/fit-all.ts';
import type { FittedCandidateInput } from './linear/fitted-model.ts';
import { leastSquaresCapabilities } from './linear/capabilities.ts';
import { priceLeastSquaresCandidate } from './linear/price.ts';
import type { NonlinearCandidateSpec } from './nonlinear/candidate.ts';
import { priceNonlinearCandidate } from './nonlinear/price-candidate.ts';
import { scoreNonlinearCandidates } from './nonlinear/score.ts';
import type { ScoringContext } from './scoring-context.ts';
import type { FittedMeansCandidateInput, GlmCandidateInput } from './glm/candidate.ts';
import { scoreFittedMeansCandidates, scoreGlmCandidates } from './glm/kind.ts';
import { priceFittedMeansCandidate, priceGlmCandidate } from './glm/price.ts';
import { GLM_CONVENTIONS } from './glm/conventions.ts';
import type { CensoredResponse } from './lifetime/censoring.ts';
import type { LifetimeCandidateInput } from './lifetime/candidate.ts';
import { priceLifetimeCandidate, scoreLifetimeCandidates } from './lifetime/kind.ts';
import { scoredModel, type ScoredModel } from './scored-model.ts';

export type CandidateInput =
  | ({ form: 'fit' } & FittedCandidateInput)
  | ExternalCandidateInput
  | GlmCandidateInput
  | FittedMeansCandidateInput
  | LifetimeCandidateInput
  | ({ form: 'expression' } & NonlinearCandidateSpec);
export type CandidateForm = CandidateInput['form'];
export type OfForm<F extends CandidateForm> = Extract<CandidateInput, { form: F }>;

/** What every kind scores on: the comparison's data (null when it sends none) and sample. */
export interface ScoringSample {
  columns: Columns | null;
  ctx: ScoringContext;
  intervalLevel: number | undefined;
  /** The response with its censoring (request-level `censoring`) on the rows; null when no lifetime candidate needs it. */
  censored?: CensoredResponse | null;
  /** options.percentiles: life percentiles a lifetime model without terms reports. */
  percentiles?: readonly number[];
  /** options.survivalAt: times at which a lifetime model without terms gives survival probabilities. */
  survivalAt?: readonly number[];
  /** Whether options.predict rows were sent (life models with terms give their percentiles there). */
  predicting?: boolean;
}

export interface CandidateKind<C extends CandidateInput> {
  /**
   * Scores this kind's candidates, keyed by their place in the request; every
   * issue goes to `issues` (shared by the whole comparison, so a kind may
   * stop early once it holds any). Models missing from the answer had issues.
   */
  score(candidates: ReadonlyMap<number, C>, sample: ScoringSample, issues: Issue[]): Map<number, ScoredModel>;
  /** The candidate's price from the request's shape alone. */
  price(candidate: C, ctx: CandidateContext): CandidateCost;
  /** The kind's own convention in words, added to the response's conventions under `key` when the comparison has such a candidate. */
  conventions?: { key: string; text: Readonly<Record<string, string>> };
}

/** Least squares fitted here on the comparison's rows. */
const linear: CandidateKind<OfForm<'fit'>> = {
  score(candidates, { columns, ctx, intervalLevel }, issues) {
    const scored = new Map<number, ScoredModel>();
    if (!columns) return scored;
    for (const [i, f] of fitAll(candidates, columns, ctx, intervalLevel, issues)) {
      scored.set(i, scoredModel(f.result, 'density', leastSquaresCapabilities(f, candidates.get(i)!, i, ctx.weights?.values)));
    }
    return scored;
  },
  price: priceLeastSquaresCandidate,
};

/** Fitted elsewhere, scored from residuals, an RSS or a stated log-likelihood. */
const external: CandidateKind<ExternalCandidateInput> = {
  score(candidates, { ctx }, issues) {
    const scored = new Map<number, ScoredModel>();
    for (const [i, c] of candidates) {
      const s = scoreExternalCandidate(c, ['candidates', i], ctx);
      if ('issues' in s) issues.push(...s.issues);
      else scored.set(i, scoredModel(s.result, 'density'));
    }
    return scored;
  },
  // A pass over its residuals at most.
  price: (c) => scoredElsewhere(c.form === 'residuals' ? c.residuals.length : 1),
};

/** Generalised linear models fitted here (family, link, offset). */
const glm: CandidateKind<GlmCandidateInput> = { score: scoreGlmCandidates, price: priceGlmCandidate, conventions: { key: 'glm', text: GLM_CONVENTIONS } };

/** Means of a generalised linear model fitted elsewhere, scored by its family's full log-likelihood. */
const fittedMeans: CandidateKind<FittedMeansCandidateInput> = {
  score: scoreFittedMeansCandidates, price: priceFittedMeansCandidate, conventions: { key: 'glm', text: GLM_CONVENTIONS },
};

/** Life distributions fitted by maximum likelihood to censored (or exact) times. */
const lifetime: CandidateKind<LifetimeCandidateInput> = {
  score: (candidates, { columns, ctx, censored, percentiles, survivalAt, predicting, intervalLevel }, issues) =>
    scoreLifetimeCandidates(candidates, { columns, rows: ctx.rows, censored: censored ?? null, percentiles, survivalAt, predicting, intervalLevel }, issues),
  price: priceLifetimeCandidate,
};

/** Nonlinear mean functions written as expressions, fitted here by Levenberg–Marquardt under the Gaussian convention. */
const nonlinear: CandidateKind<OfForm<'expression'>> = {
  score(candidates, { columns, ctx, intervalLevel }, issues) {
    if (!columns) return new Map();
    return scoreNonlinearCandidates(candidates, columns, ctx, intervalLevel, issues);
  },
  price: priceNonlinearCandidate,
};

/** Each form's kind; the kinds score in the order of first appearance here. */
export const CANDIDATE_KINDS: { [F in CandidateForm]: CandidateKind<OfForm<F>> } = {
  fit: linear,
  residuals: external,
  rss: external,
  logLikelihood: external,
  glm,
  fitted: fittedMeans,
  lifetime,
  expression: nonlinear,
};

/**
 * Every candidate scored by its kind, in the request's order. Each kind sees
 * its own candidates together (least squares builds every design before any
 * fit, so one answer names every bad term).
 */
export function scoreCandidates(candidates: readonly CandidateInput[], sample: ScoringSample, issues: Issue[]): ScoredModel[] {
  const kinds = new Map<CandidateKind<CandidateInput>, Map<number, CandidateInput>>();
  for (const form of Object.keys(CANDIDATE_KINDS) as CandidateForm[]) {
    const kind = CANDIDATE_KINDS[form] as CandidateKind<CandidateInput>;
    if (!kinds.has(kind)) kinds.set(kind, new Map());
  }
  candidates.forEach((c, i) => kinds.get(CANDIDATE_KINDS[c.form] as CandidateKind<CandidateInput>)!.set(i, c));
  const scored = new Map<number, ScoredModel>();
  for (const [kind, own] of kinds) {
    if (own.size === 0) continue;
    for (const [i, s] of kind.score(own, sample, issues)) scored.set(i, s);
  }
  return candidates.flatMap((_, i) => (scored.has(i) ? [scored.get(i)!] : []));
}

/** The conventions of the kinds the candidates belong to, keyed as each kind states (e.g. { glm: {...} }). */
export function kindConventions(candidates: readonly CandidateInput[]): Record<string, Readonly<Record<string, string>>> {
  const out: Record<string, Readonly<Record<string, string>>> = {};
  for (const c of candidates) {
    const own = CANDIDATE_KINDS[c.form].conventions;
    if (own) out[own.key] = own.text;
  }
  return out;
}
