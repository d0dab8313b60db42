// Score a line fitted in TypeScript against models the service fits, through the
// TypeScript client (clients/typescript), and read the stored record back.
//   PARSIMETRY_URL=http://127.0.0.1:8080 npx tsx examples/fitted-elsewhere.ts
import { readFileSync } from 'node:fs';
import { createClient, ParsimetryError } from '@parsimetry/client';

const client = createClient({ baseUrl: process.env.PARSIMETRY_URL ?? 'http://127.0.0.1:8080', apiKey: process.env.PARSIMETRY_KEY });

const [, ...lines] = readFileSync('examples/tiles.csv', 'utf8').trim().split('\n');
const rows = lines.map((line) => line.split(','));
const peakTemp = rows.map((r) => Number(r[0]));
const kiln = rows.map((r) => r[3]);
const shrinkage = rows.map((r) => Number(r[4]));

// Least squares of shrinkage on peakTemp, and its residual sum of squares.
const n = rows.length;
const mx = peakTemp.reduce((a, b) => a + b) / n;
const my = shrinkage.reduce((a, b) => a + b) / n;
const slope = peakTemp.reduce((s, x, i) => s + (x - mx) * (shrinkage[i] - my), 0) / peakTemp.reduce((s, x) => s + (x - mx) ** 2, 0);
const rss = peakTemp.reduce((s, x, i) => s + (shrinkage[i] - my - slope * (x - mx)) ** 2, 0);

try {
  const result = await client.compare({
    label: 'typescript line versus service fits',
    data: { columns: { peakTemp, kiln, shrinkage } },
    response: 'shrinkage',
    candidates: [
      { name: 'line-from-typescript', rss, parameters: 3, observations: n },
      { name: 'temperature-and-kiln', terms: ['peakTemp', 'kiln'] },
    ],
  });
  for (const e of result.rankings[result.conventions.rankBy] ?? []) {
    console.log(`${e.rank}  ${e.name.padEnd(26)} delta=${e.delta?.toFixed(3)}  weight=${e.weight?.toFixed(4)}`);
  }
  const stored = await client.comparison(result.id);
  console.log(result.verdict.summary);
  console.log('record', result.id, stored.integrity.ok ? 'intact' : 'failed its integrity check');
} catch (error) {
  if (!(error instanceof ParsimetryError)) throw error;
  console.error(`refused: ${error.message}`); // status, detail and the fields at fault
  process.exitCode = 1;
}
