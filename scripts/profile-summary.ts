// Where a CPU profile's samples fall: self time by function and by source
// area, from a .cpuprofile written by node --cpu-prof.
// With function names after the count, also their inclusive time (the
// function and everything it called; recursion counted once).
//   npx tsx scripts/profile-summary.ts path/to/file.cpuprofile [top, default 30] [function names...]
import { readFileSync } from 'node:fs';

interface ProfileNode { id: number; callFrame: { functionName: string; url: string; lineNumber: number }; children?: number[] }
interface Profile { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[] }

const profile = JSON.parse(readFileSync(process.argv[2], 'utf8')) as Profile;
const top = Number(process.argv[3] ?? 30);
const byId = new Map(profile.nodes.map((n) => [n.id, n]));
const selfMicros = new Map<number, number>();
profile.samples.forEach((id, i) => selfMicros.set(id, (selfMicros.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0)));
const total = [...selfMicros.values()].reduce((a, b) => a + b, 0);

const area = (url: string): string => {
  const m = /\/(src\/[^/]+(?:\/[^/]+)?)\//.exec(url) ?? /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url);
  if (m) return m[1];
  return url.startsWith('node:') ? url : url === '' ? '(native, gc, idle)' : url.split('/').slice(-2).join('/');
};
const tally = (key: (n: ProfileNode) => string) => {
  const sums = new Map<string, number>();
  for (const [id, micros] of selfMicros) {
    const k = key(byId.get(id)!);
    sums.set(k, (sums.get(k) ?? 0) + micros);
  }
  return [...sums].sort((a, b) => b[1] - a[1]).slice(0, top);
};
const print = (title: string, rows: [string, number][]) => {
  console.log(`\n${title} (of ${(total / 1000).toFixed(0)} ms sampled)`);
  for (const [k, micros] of rows) console.log(`${((100 * micros) / total).toFixed(1).padStart(5)}%  ${(micros / 1000).toFixed(0).padStart(6)} ms  ${k}`);
};
print('self time by area', tally((n) => area(n.callFrame.url)));
print('self time by function', tally((n) => `${n.callFrame.functionName || '(anonymous)'}  ${n.callFrame.url.split('/').slice(-2).join('/')}:${n.callFrame.lineNumber + 1}`));

const names = process.argv.slice(4);
if (names.length > 0) {
  const parent = new Map<number, number>();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const inclusive = new Map<string, number>(names.map((name) => [name, 0]));
  for (const [id, micros] of selfMicros) {
    const seen = new Set<string>();
    for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
      const name = byId.get(at)!.callFrame.functionName;
      if (inclusive.has(name) && !seen.has(name)) {
        seen.add(name);
        inclusive.set(name, inclusive.get(name)! + micros);
      }
    }
  }
  print('inclusive time of the named functions', [...inclusive]);
}
