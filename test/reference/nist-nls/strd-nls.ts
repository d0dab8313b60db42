// Loader for the NIST StRD nonlinear least squares files in this folder and a
// helper that fits one of them through the nonlinear engine, shared by
// test/core/models/nonlinear/nist.test.ts and scripts/nonlinear-lre-table.ts.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  expressionColumnValues, fitNonlinear, prepareNonlinearCandidate,
  type NonlinearCandidate, type NonlinearFit,
} from '../../../src/core/models/nonlinear/index.ts';
import { transformResponse } from '../../../src/core/models/response-transform.ts';
import type { Issue } from '../../../src/core/issues.ts';

const here = dirname(fileURLToPath(import.meta.url));

export interface NlsDataset {
  name: string;
  difficulty: 'lower' | 'average' | 'higher';
  model: string;
  response: 'y' | 'log(y)';
  parameterNames: string[];
  predictors: string[];
  observations: number;
  data: Record<string, number[]>;
  startValues: { start1: number[]; start2: number[] };
  certified: {
    parameters: { name: string; estimate: string; standardDeviation: string }[];
    residualSumOfSquares: string;
    residualStandardDeviation: string;
    degreesOfFreedom: number;
  };
}

/** NIST's order: lower, average, higher difficulty. */
export const NLS_FILES = [
  'misra1a', 'chwirut2', 'chwirut1', 'lanczos3', 'gauss1', 'gauss2', 'danwood', 'misra1b',
  'kirby2', 'hahn1', 'nelson', 'mgh17', 'lanczos1', 'lanczos2', 'gauss3', 'misra1c', 'misra1d', 'roszman1', 'enso',
  'mgh09', 'thurber', 'boxbod', 'rat42', 'mgh10', 'eckerle4', 'rat43', 'bennett5',
];

export function loadNls(file: string): NlsDataset {
  return JSON.parse(readFileSync(join(here, `${file}.json`), 'utf8')) as NlsDataset;
}

/** The model in the service's grammar: NIST's arctan is the grammar's atan. */
export function nlsExpression(ds: NlsDataset): string {
  return ds.model.replace(/arctan/g, 'atan');
}

export type StartKey = 'start1' | 'start2';

/** Fits a dataset from one NIST start vector through the engine's public face. */
export function fitNls(ds: NlsDataset, start: StartKey): { fit: NonlinearFit; candidate: NonlinearCandidate } | { issues: Issue[] } {
  const startValues = Object.fromEntries(ds.parameterNames.map((name, j) => [name, ds.startValues[start][j]]));
  const prepared = prepareNonlinearCandidate(
    {
      name: ds.name, expression: nlsExpression(ds), start: startValues,
      response: ds.response === 'log(y)' ? { fn: 'log' } : undefined,
    },
    (column) => ds.predictors.includes(column),
    ['candidates', 0],
  );
  if ('issues' in prepared) return prepared;
  const { candidate } = prepared;
  const rows = Array.from({ length: ds.observations }, (_, i) => i);
  const columns = expressionColumnValues(candidate, ds.data, rows, ['candidates', 0]);
  if ('issues' in columns) return columns;
  const y = Float64Array.from(ds.data.y);
  const response = candidate.response ? transformResponse(y, rows, candidate.response, ['candidates', 0, 'response']) : { values: y, jacobian: 0 };
  if ('issues' in response) return response;
  const fitted = fitNonlinear(candidate, { columns: columns.values, response, weights: null }, { at: ['candidates', 0] });
  if ('issues' in fitted) return fitted;
  return { fit: fitted.fit, candidate };
}
