// The eight distributions a lifetime candidate may name, each described by
// where its location lives (log-time for the five distributions of positive
// time, time itself for the other three), its law, and how its usual
// parameters follow from the estimation parameters: the location μ (the
// intercept when there are no terms) and the log of the scale σ, or of the
// gamma's shape κ. Names of the usual parameters are the trade's: a Weibull
// has a shape β = 1/σ and a scale η = e^μ (common practice).
import { logisticLaw, normalLaw, smallestExtremeValueLaw, type StandardLaw } from './standard-families.ts';

export const DISTRIBUTION_NAMES = [
  'exponential', 'weibull', 'lognormal', 'loglogistic', 'gamma', 'normal', 'logistic', 'smallestExtremeValue',
] as const;
export type DistributionName = (typeof DISTRIBUTION_NAMES)[number];

/** A parameter as users know it, as a function of one estimation parameter v (μ or the log scale/shape). */
export interface UsualParameter {
  name: string;
  /** 'location': a function of μ, reported only when the location has no terms; 'extra': of the log scale or shape. */
  from: 'location' | 'extra';
  value: (v: number) => number;
  /** d value / dv, for the delta method. */
  slope: (v: number) => number;
}

export type DistributionForm =
  | { kind: 'locationScale'; law: StandardLaw; fixedScale: boolean }
  | { kind: 'gamma' };

export interface Distribution {
  name: DistributionName;
  /** 'log': μ is the location of ln t (a distribution of positive time); 'time': of t. */
  scale: 'log' | 'time';
  form: DistributionForm;
  /** Label of the extra estimation parameter in the covariance; null for the exponential (σ fixed at 1). */
  extraLabel: 'log(sigma)' | 'log(shape)' | null;
  usual: UsualParameter[];
}

const identity = (v: number) => v;
const one = () => 1;
const exp = (v: number) => Math.exp(v);
const expNegative = (v: number) => Math.exp(-v);
const minusExpNegative = (v: number) => -Math.exp(-v);

const scaleOfTime: UsualParameter = { name: 'scale', from: 'location', value: exp, slope: exp };
const shapeFromSigma: UsualParameter = { name: 'shape', from: 'extra', value: expNegative, slope: minusExpNegative };
const sigmaAs = (name: string): UsualParameter => ({ name, from: 'extra', value: exp, slope: exp });
const locationAs = (name: string): UsualParameter => ({ name, from: 'location', value: identity, slope: one });

export const DISTRIBUTIONS: Readonly<Record<DistributionName, Distribution>> = {
  // Mean life θ = e^μ; the log-time scale is fixed at 1.
  exponential: {
    name: 'exponential', scale: 'log', form: { kind: 'locationScale', law: smallestExtremeValueLaw, fixedScale: true },
    extraLabel: null, usual: [scaleOfTime],
  },
  weibull: {
    name: 'weibull', scale: 'log', form: { kind: 'locationScale', law: smallestExtremeValueLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [shapeFromSigma, scaleOfTime],
  },
  lognormal: {
    name: 'lognormal', scale: 'log', form: { kind: 'locationScale', law: normalLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [locationAs('meanlog'), sigmaAs('sdlog')],
  },
  loglogistic: {
    name: 'loglogistic', scale: 'log', form: { kind: 'locationScale', law: logisticLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [shapeFromSigma, scaleOfTime],
  },
  // Density t^{κ-1} e^{-t/θ} / (Γ(κ) θ^κ), θ = e^μ.
  gamma: {
    name: 'gamma', scale: 'log', form: { kind: 'gamma' },
    extraLabel: 'log(shape)', usual: [{ name: 'shape', from: 'extra', value: exp, slope: exp }, scaleOfTime],
  },
  normal: {
    name: 'normal', scale: 'time', form: { kind: 'locationScale', law: normalLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [locationAs('mean'), sigmaAs('sd')],
  },
  logistic: {
    name: 'logistic', scale: 'time', form: { kind: 'locationScale', law: logisticLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [locationAs('location'), sigmaAs('scale')],
  },
  smallestExtremeValue: {
    name: 'smallestExtremeValue', scale: 'time', form: { kind: 'locationScale', law: smallestExtremeValueLaw, fixedScale: false },
    extraLabel: 'log(sigma)', usual: [locationAs('location'), sigmaAs('scale')],
  },
};

export function isDistributionName(name: unknown): name is DistributionName {
  return typeof name === 'string' && Object.prototype.hasOwnProperty.call(DISTRIBUTIONS, name);
}

/** Whether the distribution holds positive times only. */
export function isPositiveTime(distribution: Distribution): boolean {
  return distribution.scale === 'log';
}
