// No file under src/core may reach itself through its imports (type-only
// imports included): circles tie files' reasons to change together and make
// the seam between kinds of model and scoring leak. scripts/import-cycles.ts
// finds them; this keeps them from coming back.
import t from 'tap';
import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { importCycles, importGraph } from '../../../scripts/import-cycles.ts';

t.test('src/core has no import cycles', async (t) => {
  const cycles = importCycles('src/core');
  t.same(cycles, [], cycles.map((c) => c.join(' -> ')).join('\n'));
});

t.test('scoring reads no kind of model: nothing under src/core/scoring imports src/core/models', async (t) => {
  const models = `${join(process.cwd(), 'src', 'core', 'models')}/`;
  const leaks = [...importGraph('src/core')]
    .filter(([file]) => file.includes(`${join('src', 'core', 'scoring')}/`))
    .flatMap(([file, targets]) => targets.filter((x) => x.startsWith(models)).map((x) => `${file} -> ${x}`));
  t.same(leaks, []);
});

t.test('the finder sees a cycle through a type-only import and a subfolder', async (t) => {
  const dir = mkdtempSync(join(tmpdir(), 'cycles-'));
  mkdirSync(join(dir, 'sub'));
  writeFileSync(join(dir, 'a.ts'), "import { b } from './sub/b.ts';\nexport const a = b;\n");
  writeFileSync(join(dir, 'sub', 'b.ts'), "import type { C } from '../c.ts';\nexport const b = 1 as C;\n");
  writeFileSync(join(dir, 'c.ts'), "export type { A } from './a.ts';\nexport type C = number;\n");
  writeFileSync(join(dir, 'd.ts'), "import { a } from './a.ts';\nexport const d = a;\n");
  const cycles = importCycles(dir);
  t.equal(cycles.length, 1);
  t.same(cycles[0], [join(dir, 'a.ts'), join(dir, 'c.ts'), join(dir, 'sub', 'b.ts')]);
});
