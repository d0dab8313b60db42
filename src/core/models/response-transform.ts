// A response modelled on a transformed scale, scored on the original one. If a
// model describes g(y) as Gaussian, the density of y is that of g(y) times
// |g'(y)|, so its log-likelihood on the scale of y gains Σ ln g'(y_i): the
// change-of-variables rule (Box & Cox 1964). Without it, a log model's
// likelihood is on a different scale and its AIC cannot be compared with that
// of a model of y.
import { ddSum } from '../numeric/double-double.ts';
import { issue, type Issue, type IssuePath } from '../issues.ts';

export interface ResponseTransformSpec {
  fn: 'log' | 'sqrt' | 'boxcox';
  lambda?: number;
}

export interface TransformedResponse {
  values: Float64Array;
  /** Σ ln g'(y_i): log −Σ ln y; sqrt −Σ ln(2√y); Box–Cox (λ−1) Σ ln y. */
  jacobian: number;
}

function transformOne(spec: ResponseTransformSpec, y: number): number {
  switch (spec.fn) {
    case 'log':
      return Math.log(y);
    case 'sqrt':
      return Math.sqrt(y);
    case 'boxcox': {
      const lambda = spec.lambda ?? 1;
      // expm1 keeps the digits that (y^λ − 1) loses for λ near 0.
      return lambda === 0 ? Math.log(y) : Math.expm1(lambda * Math.log(y)) / lambda;
    }
  }
}

/**
 * The transformed response and the Jacobian term, or an issue naming the first
 * data row outside the domain (every transform here needs y > 0: the log and
 * Box–Cox Jacobians take ln y, and the sqrt Jacobian ln(2√y)).
 */
export function transformResponse(
  y: Float64Array,
  rows: readonly number[],
  spec: ResponseTransformSpec,
  at: IssuePath,
): TransformedResponse | { issues: Issue[] } {
  const values = new Float64Array(y.length);
  const logs = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) {
    if (!(y[i] > 0)) return { issues: [issue('response_transform_domain', at, { fn: spec.fn, row: rows[i], value: y[i] })] };
    values[i] = transformOne(spec, y[i]);
    logs[i] = Math.log(y[i]);
  }
  const [hi, lo] = ddSum(logs);
  const sumLog = hi + lo;
  let jacobian: number;
  if (spec.fn === 'log') jacobian = -sumLog;
  else if (spec.fn === 'sqrt') jacobian = -(y.length * Math.LN2 + sumLog / 2); // ln(2√y) = ln 2 + ½ ln y
  else jacobian = ((spec.lambda ?? 1) - 1) * sumLog;
  return { values, jacobian };
}

export function transformLabel(spec: ResponseTransformSpec): string {
  return spec.fn === 'boxcox' ? `boxcox(λ=${spec.lambda})` : spec.fn;
}
