// src/openapi.ts from the service's committed OpenAPI document, by openapi-typescript.
//   node scripts/generate-types.mjs           write src/openapi.ts
//   node scripts/generate-types.mjs --check   exit 1 when src/openapi.ts is not what it would write
// From the repository root: `npm run clients:types` (and `npm run openapi` runs it after the document).
import { readFileSync, writeFileSync } from 'node:fs';
import openapiTS, { astToString, COMMENT_HEADER } from 'openapi-typescript';

const documentUrl = new URL('../../../openapi/openapi.json', import.meta.url);
const target = new URL('../src/openapi.ts', import.meta.url);

// defaultNonNullable off: a field with a default (intercept, top, ...) stays optional in the
// request types, as the service treats it.
const ast = await openapiTS(JSON.parse(readFileSync(documentUrl, 'utf8')), { defaultNonNullable: false });
const generated = COMMENT_HEADER + astToString(ast);

if (process.argv.includes('--check')) {
  if (readFileSync(target, 'utf8') !== generated) {
    console.error('clients/typescript/src/openapi.ts does not match openapi/openapi.json: run `npm run clients:types` at the repository root and commit the result');
    process.exit(1);
  }
  console.log('clients/typescript/src/openapi.ts matches openapi/openapi.json');
} else {
  writeFileSync(target, generated);
  console.log('wrote clients/typescript/src/openapi.ts');
}
