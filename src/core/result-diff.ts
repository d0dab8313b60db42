// Which values of a stored JSON result differ from a freshly computed one, and by
// how much. Pure: two JSON values in, a list of changes out.
//
// Arrays of objects that carry a unique identifying string (a model's `name`, a
// coefficient's `term`, a caution's `code`, a leaning's `model`) are matched by
// that key, not by position: rankings are sorted by rank, so a model that moved
// from second to first must read as a change of its `rank` (and of the numbers
// that really changed), not as every entry of the ranking changing.
// Paths are RFC 6901 JSON Pointers without the leading "/", as in problem
// details; they point into the stored value (into the new one for an entry that
// exists only there).

export type JsonValue = null | boolean | number | string | JsonValue[] | { [key: string]: JsonValue };

export interface ValueChange {
  path: string;
  /** 'value': both sides hold a leaf that differs (or of different types); 'added'/'removed': one side lacks it. */
  change: 'value' | 'added' | 'removed';
  /** Where the matched entry sits in the new value, when that differs from `path` (an entry that moved). */
  nowPath?: string;
  stored: JsonValue | null;
  now: JsonValue | null;
  /** now − stored, when both are numbers. */
  absoluteChange: number | null;
  /** (now − stored) / |stored|, when both are numbers and stored ≠ 0. */
  relativeChange: number | null;
}

export interface ResultDiff {
  changes: ValueChange[];
  /** Leaves (numbers, strings, booleans, nulls) compared on the stored side. */
  leavesCompared: number;
}

/** Keys that identify an entry of an array of objects, tried in this order. */
export const MATCH_KEYS = ['name', 'term', 'code', 'model'] as const;

function segment(key: string | number): string {
  return String(key).replace(/~/g, '~0').replace(/\//g, '~1');
}

function join(path: string, key: string | number): string {
  return path === '' ? segment(key) : `${path}/${segment(key)}`;
}

function isObject(value: JsonValue): value is { [key: string]: JsonValue } {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

function leafChange(path: string, stored: JsonValue, now: JsonValue): ValueChange {
  const numeric = typeof stored === 'number' && typeof now === 'number';
  return {
    path,
    change: 'value',
    stored,
    now,
    absoluteChange: numeric ? finiteOrNull(now - stored) : null,
    relativeChange: numeric && stored !== 0 ? finiteOrNull((now - stored) / Math.abs(stored)) : null,
  };
}

function countLeaves(value: JsonValue): number {
  if (Array.isArray(value)) return value.reduce<number>((n, v) => n + countLeaves(v), 0);
  if (isObject(value)) return Object.values(value).reduce<number>((n, v) => n + countLeaves(v), 0);
  return 1;
}

/** The key by which both arrays' entries can be matched: every entry an object with a unique string under it. */
function matchKey(a: JsonValue[], b: JsonValue[]): string | null {
  for (const key of MATCH_KEYS) {
    const usable = (list: JsonValue[]) => {
      const seen = new Set<string>();
      for (const item of list) {
        if (!isObject(item) || typeof item[key] !== 'string' || seen.has(item[key] as string)) return false;
        seen.add(item[key] as string);
      }
      return true;
    };
    if (a.length + b.length > 0 && usable(a) && usable(b)) return key;
  }
  return null;
}

class Walk {
  readonly changes: ValueChange[] = [];
  leaves = 0;

  compare(stored: JsonValue, now: JsonValue, path: string, nowPath: string): void {
    if (Array.isArray(stored) && Array.isArray(now)) return this.arrays(stored, now, path, nowPath);
    if (isObject(stored) && isObject(now)) return this.objects(stored, now, path, nowPath);
    if (Array.isArray(stored) || isObject(stored) || Array.isArray(now) || isObject(now)) {
      // A container on one side and something else on the other: one change for the whole value.
      this.leaves += countLeaves(stored);
      this.changes.push(this.located(leafChange(path, stored, now), path, nowPath));
      return;
    }
    this.leaves += 1;
    if (stored !== now) {
      this.changes.push(this.located(leafChange(path, stored, now), path, nowPath));
    }
  }

  private located(change: ValueChange, path: string, nowPath: string): ValueChange {
    return nowPath === path ? change : { ...change, nowPath };
  }

  private removed(path: string, stored: JsonValue): void {
    this.leaves += countLeaves(stored);
    this.changes.push({ path, change: 'removed', stored, now: null, absoluteChange: null, relativeChange: null });
  }

  private added(nowPath: string, now: JsonValue): void {
    this.changes.push({ path: nowPath, change: 'added', stored: null, now, absoluteChange: null, relativeChange: null });
  }

  private objects(stored: { [k: string]: JsonValue }, now: { [k: string]: JsonValue }, path: string, nowPath: string): void {
    for (const key of Object.keys(stored)) {
      if (Object.hasOwn(now, key)) this.compare(stored[key], now[key], join(path, key), join(nowPath, key));
      else this.removed(join(path, key), stored[key]);
    }
    for (const key of Object.keys(now)) {
      if (!Object.hasOwn(stored, key)) this.added(join(nowPath, key), now[key]);
    }
  }

  private arrays(stored: JsonValue[], now: JsonValue[], path: string, nowPath: string): void {
    const key = matchKey(stored, now);
    if (key === null) {
      const common = Math.min(stored.length, now.length);
      for (let i = 0; i < common; i++) this.compare(stored[i], now[i], join(path, i), join(nowPath, i));
      for (let i = common; i < stored.length; i++) this.removed(join(path, i), stored[i]);
      for (let i = common; i < now.length; i++) this.added(join(nowPath, i), now[i]);
      return;
    }
    const nowIndex = new Map<string, number>();
    now.forEach((item, i) => nowIndex.set((item as { [k: string]: JsonValue })[key] as string, i));
    const matched = new Set<number>();
    stored.forEach((item, i) => {
      const j = nowIndex.get((item as { [k: string]: JsonValue })[key] as string);
      if (j === undefined) this.removed(join(path, i), item);
      else {
        matched.add(j);
        this.compare(item, now[j], join(path, i), join(nowPath, j));
      }
    });
    now.forEach((item, j) => {
      if (!matched.has(j)) this.added(join(nowPath, j), item);
    });
  }
}

/** Every leaf of `stored` compared with its counterpart in `now`. */
export function diffResults(stored: JsonValue, now: JsonValue): ResultDiff {
  const walk = new Walk();
  walk.compare(stored, now, '', '');
  return { changes: walk.changes, leavesCompared: walk.leaves };
}
