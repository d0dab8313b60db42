// What the body checks cost: the service's JSON body parser (src/http/json-body.ts:
// depth scan, JSON.parse, refusal walk, duplicate-key count) against plain
// JSON.parse on the same text, in one run, as a ratio. Two bodies: a columnar
// one of numbers (~30 MB, the common bulk) and one of text columns (factor
// levels, where every value is a string the scan must step over).
//   node --expose-gc --import tsx scripts/bench-json-body.ts [megabytes=30] [repeats=9]
// (--expose-gc lets each timing start from a collected heap, so one parse's
// garbage is not charged to the next; without it the figures are noisier.)
// The data are random from a seeded generator (a benchmark needs only their shape).
import { parseJsonBody } from '../src/http/json-body.ts';

const megabytes = Number(process.argv[2] ?? 30);
const repeats = Number(process.argv[3] ?? 9);
const collect = (globalThis as { gc?: () => void }).gc ?? (() => {});

let seed = 20260311;
const uniform = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);

function columnarBody(targetBytes: number, text: boolean): string {
  const names = ['peakTemp', 'holdMinutes', 'moisture', 'shrinkage', 'kiln'];
  // ~19 bytes per number as JSON.stringify writes a random double; ~8 per short level.
  const rows = Math.round(targetBytes / names.length / (text ? 8 : 19));
  const levels = ['east', 'west', 'north', 'south'];
  const columns: Record<string, (number | string)[]> = {};
  for (const name of names) {
    columns[name] = Array.from({ length: rows }, () => (text ? levels[Math.floor(uniform() * 4)] : 1000 * uniform()));
  }
  return JSON.stringify({
    data: { columns },
    response: 'shrinkage',
    candidates: [{ name: 'linear', terms: ['peakTemp'] }, { name: 'both', terms: ['peakTemp', 'holdMinutes'] }],
  });
}

/** Median of `repeats` timings (ms), alternating the two so drift hits both alike. */
function measure(text: string): { plain: number; service: number } {
  const plain: number[] = [];
  const service: number[] = [];
  for (let r = 0; r < repeats; r++) {
    collect();
    let t0 = performance.now();
    JSON.parse(text);
    plain.push(performance.now() - t0);
    collect();
    t0 = performance.now();
    const parsed = parseJsonBody(text, 64);
    service.push(performance.now() - t0);
    if (!('value' in parsed)) throw new Error(`refused: ${parsed.refused.message}`);
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  return { plain: median(plain), service: median(service) };
}

console.log(`JSON body parser against plain JSON.parse, median of ${repeats}, Node ${process.version}`);
console.log('body                               MB   JSON.parse ms   service parser ms   ratio');
for (const [label, text] of [['numeric columns', columnarBody(megabytes * 1e6, false)], ['text columns (factor levels)', columnarBody(megabytes * 1e6 / 3, true)]] as const) {
  const { plain, service } = measure(text);
  console.log(`${label.padEnd(32)} ${(text.length / 1e6).toFixed(1).padStart(5)} ${plain.toFixed(0).padStart(15)} ${service.toFixed(0).padStart(19)} ${(service / plain).toFixed(2).padStart(7)}x`);
}
