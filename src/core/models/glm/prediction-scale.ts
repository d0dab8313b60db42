// A GLM's link as the "model scale" of the shared prediction machinery
// (inference/prediction-intervals.ts, averaging/averaged-predictions.ts):
// location η̂, its standard error, a Wald interval on η and its ends mapped by
// the inverse link to the mean. That machinery reads an increasing scale
// (lower end to lower end), so a decreasing link (inverse, inverseSquare) is
// carried as −η: the same intervals, ends in the right order.
import type { ResponseScale } from '../../inference/back-transform.ts';
import { FAMILIES } from './families.ts';
import { LINKS } from './links.ts';
import type { GlmFamilyName, GlmLinkName } from './types.ts';

const DECREASING: ReadonlySet<GlmLinkName> = new Set(['inverse', 'inverseSquare']);
/** Links whose inverse maps every η into the family's range (log can only overflow, which leaves the end open). */
const UNBOUNDED: ReadonlySet<GlmLinkName> = new Set(['logit', 'probit', 'cloglog', 'log']);

export function linkScaleSign(link: GlmLinkName): 1 | -1 {
  return DECREASING.has(link) ? -1 : 1;
}

export function linkPredictionDescription(family: GlmFamilyName, link: GlmLinkName): string {
  const mean = family === 'binomial' ? 'the probability of success per trial' : 'the mean response';
  return `mean: ${mean}, μ̂ = g⁻¹(η̂) through the ${link} link (η̂ = x'β̂ plus the row's offset); the interval is the Wald interval η̂ ± z·se(η̂) on the link scale (t on n − rank df for the Gaussian family) with both ends mapped by the inverse link, so it stays inside the family's range and need not be symmetric; an end beyond the range is cut at its edge (0) or left open (null); standard error by the delta method |dμ/dη|·se(η̂); no interval for a new observation (a single count or pass/fail outcome has no Wald interval), so predictionLower and predictionUpper are null`;
}

export function linkResponseScale(family: GlmFamilyName, link: GlmLinkName): ResponseScale {
  const g = LINKS[link];
  const f = FAMILIES[family];
  const sign = linkScaleSign(link);
  const inside = (mu: number) => Number.isFinite(mu) && f.validMean(mu, 1 - mu) && g.validEta(g.link(mu));
  return {
    toModel: (mu) => (inside(mu) ? sign * g.link(mu) : family === 'binomial' && mu >= 1 ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY),
    toModelSlope: (mu) => (inside(mu) ? sign / g.derivative(g.link(mu)) : 0),
    bounded: !(UNBOUNDED.has(link) || (link === 'identity' && family === 'gaussian')),
    fromModel: (m) => {
      const eta = sign * m;
      const mu = g.validEta(eta) ? g.mean(eta) : Number.NaN;
      if (Number.isFinite(mu) && f.validMean(mu, g.complement(eta))) return mu;
      // Past a decreasing link's pole, an overflowing exp, or an interval end at η = +∞ (a
      // standard error that overflowed at an extreme row): beyond every finite mean, never cut to 0.
      if (sign < 0 || mu === Number.POSITIVE_INFINITY || eta === Number.POSITIVE_INFINITY) return 'above';
      return family === 'binomial' && mu >= 1 ? 'above' : 'below';
    },
    slope: (m) => sign * g.derivative(sign * m),
    description: linkPredictionDescription(family, link),
  };
}
