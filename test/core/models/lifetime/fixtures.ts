// Shared fixtures of the lifetime tests: the committed reference files under
// test/reference/lifetime/ (made by scripts/lifetime-reference.py and .R) and
// designs built the way the service builds them.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildDesign } from '../../../../src/core/design/index.ts';
import { seededUniform as demoUniform } from '../../../../scripts/seeded-random.ts';
import type { Columns, DesignMatrix, Term } from '../../../../src/core/types.ts';
import { censoredResponse, type CensoredResponse, type CensoringColumns } from '../../../../src/core/models/lifetime/index.ts';

const DIR = fileURLToPath(new URL('../../../reference/lifetime/', import.meta.url));

export function readReference<T = any>(name: string): T {
  return JSON.parse(readFileSync(DIR + name, 'utf8')) as T;
}

/** The seeded solder-joint life test (scripts/lifetime-reference.py), as data columns. */
export function solderJoints(): Columns {
  const lines = readFileSync(DIR + 'solder-joints.csv', 'utf8').trim().split('\n').map((l) => l.split(','));
  const head = lines[0];
  const rows = lines.slice(1);
  const numeric = new Set(['cycles', 'upper', 'kelvin', 'load', 'rightOnlyCycles']);
  const columns: Record<string, (number | string | null)[]> = {};
  head.forEach((name, j) => {
    columns[name] = rows.map((r) => (r[j] === '' ? null : numeric.has(name) ? Number(r[j]) : r[j]));
  });
  return columns;
}

/** The survreg formula of the fixtures: ~ I(1/kelvin) + finish (reference matte) + load. */
export const SOLDER_TERMS: Term[] = [
  { kind: 'transform', of: 'kelvin', fn: 'reciprocal' },
  { kind: 'factor', of: 'finish', reference: 'matte' },
  'load',
];

export function design(columns: Columns, terms: readonly Term[], rows?: readonly number[]): DesignMatrix {
  const used = rows ?? Object.values(columns)[0].map((_, i) => i);
  const built = buildDesign(columns, terms, true, used);
  if ('issues' in built) throw new Error(JSON.stringify(built.issues));
  return built.design;
}

export function response(columns: Columns, time: string, censoring: CensoringColumns | null): CensoredResponse {
  const rows = columns[time].map((_, i) => i);
  const built = censoredResponse(columns, time, censoring, rows);
  if ('issues' in built) throw new Error(JSON.stringify(built.issues));
  return built.response;
}

/** Lieblein & Zelen (1956) ball-bearing endurances, as embedded in bearings-scipy.json. */
export function bearings(): number[] {
  return readReference('bearings-scipy.json').data;
}

/** |a - b| / |b|, or |a - b| when b is 0. */
export function relativeError(a: number, b: number): number {
  return b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b);
}

/**
 * The demo's seeded generator (scripts/demo-data.ts, mulberry32), moved off
 * 0 by half a step: the simulations take ln(-ln U).
 */
export function seededUniform(seed: number): () => number {
  const uniform = demoUniform(seed);
  return () => uniform() + 0.5 / 4294967296;
}
