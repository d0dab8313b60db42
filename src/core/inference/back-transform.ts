// From a model of g(y) back to the scale of y, for predictions. A model of
// g(y) with Gaussian errors says g(y) at x is normal with mean μ(x); since g
// is increasing, the median of y at x is g⁻¹(μ(x)), and any quantile of g(y)
// maps to the same quantile of y. So the service reports the MEDIAN
// g⁻¹(μ̂): its intervals are g⁻¹ of the transformed-scale intervals, exact
// with no further approximation. For a model of y itself the mean and the
// median coincide, so predictions of every model — and their average — are of
// one quantity, the median response. (The mean of y would need a correction
// that depends on σ² — exp(μ + σ²/2) for log — and has no closed form for
// Box–Cox; it is not what is reported.) The standard error on the original
// scale is the delta method's |dg⁻¹/dμ| · se.
import type { ResponseTransformSpec } from '../models/response-transform.ts';

/** Where a value of the model's scale falls when taken back to the scale of y. */
export type BackTransformed = number | 'below' | 'above';

export interface ResponseScale {
  /** g(y), or ±Infinity for y below or above the range g maps. */
  toModel(y: number): number;
  /** dg/dy at a y inside the range (0 outside). */
  toModelSlope(y: number): number;
  /** True when g does not map onto the whole real line, so a model-scale value can fall outside it (sqrt, Box–Cox). */
  bounded: boolean;
  /** g⁻¹(μ), or 'below' / 'above' when μ lies outside the range of g. */
  fromModel(mu: number): BackTransformed;
  /** dg⁻¹/dμ at a μ inside the range of g. */
  slope(mu: number): number;
  /** The back-transform in words and symbols, for the response. */
  description: string;
}

const IDENTITY: ResponseScale = {
  toModel: (y) => y,
  toModelSlope: () => 1,
  bounded: false,
  fromModel: (mu) => mu,
  slope: () => 1,
  description: 'none: the model describes the response itself; its prediction is the mean response, which is also its median',
};

function boxCox(lambda: number): ResponseScale {
  if (lambda === 0) return LOG;
  // g(y) = (y^λ − 1)/λ maps (0, ∞) onto (−1/λ, ∞) for λ > 0 and onto (−∞, −1/λ) for λ < 0.
  const edge = -1 / lambda;
  return {
    toModel: (y) => (y > 0 ? Math.expm1(lambda * Math.log(y)) / lambda : Number.NEGATIVE_INFINITY),
    toModelSlope: (y) => (y > 0 ? Math.exp((lambda - 1) * Math.log(y)) : 0),
    bounded: true,
    fromModel: (mu) => {
      if (lambda > 0 && !(mu > edge)) return 'below';
      if (lambda < 0 && !(mu < edge)) return 'above';
      return Math.exp(Math.log1p(lambda * mu) / lambda);
    },
    slope: (mu) => Math.exp((1 / lambda - 1) * Math.log1p(lambda * mu)),
    description: `median: (1 + λμ̂)^(1/λ) with λ = ${lambda}, the median of y when the Box–Cox transform of y is normal; intervals are the transformed-scale intervals taken back the same way; standard error by the delta method (1 + λμ̂)^(1/λ − 1) · se`,
  };
}

const LOG: ResponseScale = {
  toModel: (y) => (y > 0 ? Math.log(y) : Number.NEGATIVE_INFINITY),
  toModelSlope: (y) => (y > 0 ? 1 / y : 0),
  bounded: false,
  fromModel: (mu) => {
    const y = Math.exp(mu);
    return y === Number.POSITIVE_INFINITY ? 'above' : y;
  },
  slope: (mu) => Math.exp(mu),
  description: 'median: exp(μ̂), the median of y when log y is normal (the mean would be exp(μ̂ + σ²/2)); intervals are exp of the log-scale intervals; standard error by the delta method exp(μ̂) · se',
};

const SQRT: ResponseScale = {
  toModel: (y) => (y >= 0 ? Math.sqrt(y) : Number.NEGATIVE_INFINITY),
  toModelSlope: (y) => (y > 0 ? 0.5 / Math.sqrt(y) : 0),
  bounded: true,
  fromModel: (mu) => (mu >= 0 ? mu * mu : 'below'),
  slope: (mu) => 2 * mu,
  description: 'median: μ̂², the median of y when √y is normal (the mean would be μ̂² + σ²); intervals are the squares of the square-root-scale intervals, a negative end taken as 0; standard error by the delta method 2μ̂ · se',
};

export function responseScale(spec: ResponseTransformSpec | null | undefined): ResponseScale {
  if (!spec) return IDENTITY;
  if (spec.fn === 'log') return LOG;
  if (spec.fn === 'sqrt') return SQRT;
  return boxCox(spec.lambda ?? 1);
}

/** An interval end taken back to y: below the range of g is y's lower edge 0; above it, no finite end (null). */
export function backTransformedEnd(scale: ResponseScale, mu: number | null): number | null {
  if (mu === null) return null;
  const y = scale.fromModel(mu);
  if (y === 'below') return 0;
  if (y === 'above') return null;
  return Number.isFinite(y) ? y : null;
}
