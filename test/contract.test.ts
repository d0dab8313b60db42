// The committed contract (openapi/openapi.json) equals what the code serves, and
// it is a valid OpenAPI 3.1 document.
import { readFileSync } from 'node:fs';
import t from 'tap';
import { validate } from '@readme/openapi-parser';
import { openapiDocument } from '../src/http/openapi-document.ts';
import { buildTestApp } from './helper.ts';

t.test('openapi/openapi.json is up to date (run `npm run openapi` after changing a schema)', async (t) => {
  const committed = readFileSync(new URL('../openapi/openapi.json', import.meta.url), 'utf8');
  t.equal(await openapiDocument(), committed);
});

t.test('the served document is valid OpenAPI 3.1 and names the fixed paths', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'GET', url: '/openapi.json' });
  t.equal(res.statusCode, 200);
  const doc = res.json();
  t.equal(doc.openapi, '3.1.0');
  const result = await validate(structuredClone(doc));
  t.ok(result.valid, result.valid ? 'valid' : JSON.stringify(result.errors));
  t.ok(doc.paths['/v1/comparisons']?.post, 'POST /v1/comparisons is documented');
});

t.test('interactive docs are served at /docs', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'GET', url: '/docs/' });
  t.equal(res.statusCode, 200);
  t.match(res.headers['content-type'], /text\/html/);
});
