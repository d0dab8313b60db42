// A short key per model (A, B, …, Z, AA, AB, …) in the record's own model
// order, so a picture can name every model unambiguously where its full name
// does not fit: the key stands beside each bar and in each strip box, and the
// chart spells out every key's full name whenever any name was shortened.
// Letters rather than numbers, so a key is never read as a rank; in the
// record's order rather than a ranking's, so a model keeps its key in every
// chart of the record, whatever the criterion.
import type { StoredComparisonView } from './types.ts';

/** Bijective base 26: 0 → A, 25 → Z, 26 → AA, 701 → ZZ, 702 → AAA. */
export function modelKeyAt(index: number): string {
  let key = '';
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) key = String.fromCharCode(65 + ((n - 1) % 26)) + key;
  return key;
}

/** Every model of the record with its key: models[] first, then names met only in a ranking. */
export function modelKeys(record: StoredComparisonView): Map<string, string> {
  const keys = new Map<string, string>();
  const add = (name: unknown) => {
    if (typeof name === 'string' && !keys.has(name)) keys.set(name, modelKeyAt(keys.size));
  };
  for (const model of record.result.models ?? []) add(model.name);
  for (const entries of Object.values(record.result.rankings ?? {})) for (const entry of entries ?? []) add(entry.name);
  return keys;
}
