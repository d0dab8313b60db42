// Lists import cycles among the TypeScript files under a folder (default
// src/), type-only imports included: a circle of types still ties the files'
// reasons to change together. A regex walk over `import … from '…'` and
// `export … from '…'` with relative specifiers; enough for this code base,
// which writes every import with its .ts extension.
//   npx tsx scripts/import-cycles.ts [folder]
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const SPECIFIER = /(?:^|\n)\s*(?:import|export)\b[^'";]*?\bfrom\s*['"](\.{1,2}\/[^'"]+)['"]/g;

function filesUnder(folder: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(folder)) {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) out.push(...filesUnder(path));
    else if (path.endsWith('.ts')) out.push(path);
  }
  return out;
}

/** Each file's relative imports that resolve to files under the folder. */
export function importGraph(folder: string): Map<string, string[]> {
  const files = new Set(filesUnder(resolve(folder)));
  const graph = new Map<string, string[]>();
  for (const file of files) {
    const text = readFileSync(file, 'utf8');
    const targets = new Set<string>();
    for (const m of text.matchAll(SPECIFIER)) {
      const target = resolve(dirname(file), m[1]);
      if (files.has(target)) targets.add(target);
    }
    graph.set(file, [...targets].sort());
  }
  return graph;
}

/** Strongly connected components with more than one file (or a file importing itself), by Tarjan's algorithm. */
export function importCycles(folder: string): string[][] {
  const graph = importGraph(folder);
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const cycles: string[][] = [];
  let next = 0;
  const visit = (v: string): void => {
    index.set(v, next);
    low.set(v, next++);
    stack.push(v);
    onStack.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) {
        low.set(v, Math.min(low.get(v)!, index.get(w)!));
      }
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || (graph.get(v) ?? []).includes(v)) cycles.push(component.sort());
    }
  };
  for (const v of [...graph.keys()].sort()) if (!index.has(v)) visit(v);
  return cycles;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const folder = process.argv[2] ?? 'src';
  const cycles = importCycles(folder);
  for (const c of cycles) console.log(c.map((f) => relative(process.cwd(), f)).join('\n  ↔ '));
  console.log(`${cycles.length} import cycle(s) under ${folder}`);
  process.exitCode = cycles.length > 0 ? 1 : 0;
}
