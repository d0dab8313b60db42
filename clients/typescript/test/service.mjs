// What the client's tests share: the live service's address and the example data.
// The service is started by the repository's test (test/clients/typescript.test.ts), or by hand:
//   PARSIMETRY_URL=http://127.0.0.1:8080 npm test
import { readFileSync } from 'node:fs';

export const baseUrl = process.env.PARSIMETRY_URL;
if (!baseUrl) {
  throw new Error('set PARSIMETRY_URL to a running parsimetry service (the repository\'s `npx tap test/clients/typescript.test.ts` starts one)');
}

/** examples/tiles.csv: the invented tile-shrinkage scenario of the examples. */
export const tilesCsv = readFileSync(new URL('../../../examples/tiles.csv', import.meta.url), 'utf8');

export function tilesColumns() {
  const [header, ...lines] = tilesCsv.trim().split('\n');
  const names = header.split(',');
  const columns = Object.fromEntries(names.map((n) => [n, []]));
  for (const line of lines) {
    line.split(',').forEach((cell, i) => columns[names[i]].push(names[i] === 'kiln' ? cell : Number(cell)));
  }
  return columns;
}

/** A label no other run shares, so listings can be filtered to this run's records. */
export const runLabel = (what) => `ts-client ${what} ${Date.now()}-${Math.random().toString(16).slice(2)}`;
