// Loader for the NIST StRD linear least squares files in this folder, the
// polynomial / Longley design builder and the log relative error (LRE), shared
// by test/core/fit/nist.test.ts and scripts/lre-table.ts.

import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DesignMatrix } from '../../../src/core/types.ts';
import { ddPowInt } from '../../../src/core/numeric/double-double.ts';

const here = dirname(fileURLToPath(import.meta.url));

export interface StrdDataset {
  name: string;
  intercept: boolean;
  polynomialDegree: number | null;
  predictors: string[];
  observations: number;
  data: Record<string, number[]>;
  certified: {
    parameters: { name: string; estimate: string; standardDeviation: string }[];
    residualStandardDeviation: string;
    rSquared: string;
    anova: { residual: { sumOfSquares: string } };
  };
}

export const STRD_FILES = [
  'norris', 'pontius', 'noint1', 'noint2', 'filip', 'longley',
  'wampler1', 'wampler2', 'wampler3', 'wampler4', 'wampler5',
];

export function loadStrd(file: string): StrdDataset {
  return JSON.parse(readFileSync(join(here, `${file}.json`), 'utf8')) as StrdDataset;
}

/**
 * The caller's design for a dataset: intercept column of ones when the model has
 * one, then x, x^2, ..., x^N (each power formed by ddPowInt, as the design
 * builder does for a {kind: "power"} term) or, for Longley, x1..x6 as given.
 */
export function strdDesign(ds: StrdDataset): { design: DesignMatrix; y: Float64Array } {
  const n = ds.observations;
  const labels: string[] = [];
  const high: Float64Array[] = [];
  const low: Float64Array[] = [];
  const termOfColumn: number[] = [];
  if (ds.intercept) {
    labels.push('intercept');
    high.push(new Float64Array(n).fill(1));
    low.push(new Float64Array(n));
    termOfColumn.push(-1);
  }
  if (ds.polynomialDegree !== null) {
    const x = ds.data.x;
    for (let k = 1; k <= ds.polynomialDegree; k++) {
      const h = new Float64Array(n);
      const l = new Float64Array(n);
      for (let i = 0; i < n; i++) [h[i], l[i]] = ddPowInt(x[i], k);
      labels.push(k === 1 ? 'x' : `x^${k}`);
      high.push(h);
      low.push(l);
      termOfColumn.push(k - 1);
    }
  } else {
    ds.predictors.forEach((name, t) => {
      labels.push(name);
      high.push(Float64Array.from(ds.data[name]));
      low.push(new Float64Array(n));
      termOfColumn.push(t);
    });
  }
  return {
    design: { rows: n, labels, high, low, intercept: ds.intercept, termOfColumn },
    y: Float64Array.from(ds.data.y),
  };
}

/** Significant digits NIST prints in a certified value ("0.000000000000000" counts its decimals). */
export function printedDigits(cert: string): number {
  const mantissa = cert.replace(/^[-+]/, '').split(/[eE]/)[0];
  const digits = mantissa.replace('.', '');
  const significant = digits.replace(/^0+/, '');
  return significant.length > 0 ? significant.length : digits.length - 1;
}

/**
 * Log relative error -log10(|est - cert| / |cert|), capped at the digits NIST
 * prints; absolute error when the certified value is 0. A null or non-finite
 * estimate scores 0.
 */
export function lre(est: number | null, cert: string): number {
  const c = Number(cert);
  const cap = printedDigits(cert);
  if (est === null || !Number.isFinite(est)) return 0;
  const err = c === 0 ? Math.abs(est) : Math.abs(est - c) / Math.abs(c);
  if (err === 0) return cap;
  return Math.max(0, Math.min(cap, -Math.log10(err)));
}
