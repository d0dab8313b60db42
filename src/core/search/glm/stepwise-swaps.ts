// The heuristic for pools too large to fit every subset: from a start, fit
// every admissible neighbour of the current subset (one pool term added, one
// removed, or one swapped for another) and move to the best of them while it
// lowers the criterion. It runs twice, from the always terms alone and from
// the whole pool, and keeps every subset it fitted (each once). It ends at a
// local optimum, so its best models are never proven the best: the answer
// says so (`proven` false). Each neighbour starts IRLS from the current
// subset's coefficients.
import type { GlmTally } from './glm-tally.ts';
import { fitSubset, type Coefficients } from './subset-fit.ts';
import type { GlmSearchData } from './types.ts';
import type { SearchCriterion } from '../types.ts';

interface Seen {
  value: number;
  coefficients: Coefficients | undefined;
}

function neighbours(current: readonly number[], m: number): number[][] {
  const held = new Set(current);
  const out: number[][] = [];
  const sorted = (xs: number[]) => xs.sort((a, b) => a - b);
  for (let j = 0; j < m; j++) if (!held.has(j)) out.push(sorted([...current, j]));
  for (const i of current) out.push(current.filter((x) => x !== i));
  for (const i of current) {
    for (let j = 0; j < m; j++) if (!held.has(j)) out.push(sorted([...current.filter((x) => x !== i), j]));
  }
  return out;
}

/** The whole pool less every term that cannot enter, and (repeatedly) every term whose needs are gone. */
function largestAdmissible(tally: GlmTally, m: number): number[] {
  let held = [...Array(m).keys()];
  for (;;) {
    const kept = held.filter((j) => tally.admissibleWithin(j, held));
    if (kept.length === held.length) return held;
    held = kept;
  }
}

/** Returns true when the visit budget ran out before both runs reached their local optimum. */
export function stepwiseWithSwaps(data: GlmSearchData, criterion: SearchCriterion, tally: GlmTally, maxVisits: number): boolean {
  const m = data.poolSize;
  const seen = new Map<string, Seen>();
  let stopped = false;
  const evaluate = (subset: number[], start: Coefficients | undefined): Seen | null => {
    const key = subset.join(',');
    const known = seen.get(key);
    if (known) return known;
    if (tally.visited >= maxVisits) {
      stopped = true;
      return null;
    }
    const fit = fitSubset(data, subset, criterion, start);
    const value = tally.record(subset, fit, start !== undefined);
    const entry = { value, coefficients: fit.ok ? fit.coefficients : start };
    seen.set(key, entry);
    return entry;
  };
  const run = (first: number[]) => {
    let current = first;
    let here = evaluate(current, undefined);
    while (here && !stopped) {
      let best: { subset: number[]; seen: Seen } | null = null;
      for (const next of neighbours(current, m)) {
        if (!tally.admissible(next)) continue;
        const s = evaluate(next, here.coefficients);
        if (!s) break;
        if (s.value < (best ? best.seen.value : here.value)) best = { subset: next, seen: s };
      }
      if (!best) return;
      current = best.subset;
      here = best.seen;
    }
  };
  run([]);
  if (!stopped) run(largestAdmissible(tally, m));
  return stopped;
}
