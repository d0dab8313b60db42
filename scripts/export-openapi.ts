// Regenerates openapi/openapi.json from the same zod schemas that validate
// requests; test/contract.test.ts fails when the committed file drifts.
import { writeFileSync, mkdirSync } from 'node:fs';
import { openapiDocument } from '../src/http/openapi-document.ts';

const text = await openapiDocument();
mkdirSync(new URL('../openapi/', import.meta.url), { recursive: true });
writeFileSync(new URL('../openapi/openapi.json', import.meta.url), text);
process.stdout.write('wrote openapi/openapi.json\n');
