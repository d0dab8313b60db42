// Random malformed bodies against every POST route the app registers: arbitrary
// JSON, mutated valid bodies (dropped keys, wrong types, huge numbers, deep
// nesting, long and odd unicode strings) and broken JSON text. The contract
// (api.md, Errors): never a 5xx for anything a caller sent; every refusal is a
// 4xx problem+json; the process keeps answering.
import fc from 'fast-check';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { demoComparison } from '../../scripts/demo-data.ts';

const RUNS = 300;

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

function validBody(url: string): Json {
  if (url === '/v1/comparisons') return demoComparison() as unknown as Json;
  if (url === '/v1/searches') {
    const d = demoComparison();
    return { data: d.data, response: 'shrinkage', pool: ['peakTemp', 'holdMinutes', 'moisture', 'kiln'], rankBy: 'aicc', top: 5 } as unknown as Json;
  }
  return {};
}

const nasty: fc.Arbitrary<Json> = fc.oneof<fc.Arbitrary<Json>[]>(
  fc.jsonValue() as fc.Arbitrary<Json>,
  fc.constantFrom(1e308, -1e308, Number.MAX_SAFE_INTEGER * 4, 5e-324, 0, -0, 1e9, -1),
  fc.string({ unit: 'grapheme', maxLength: 50 }),
  fc.string({ minLength: 10_000, maxLength: 20_000 }),
  fc.constantFrom('__proto__', 'constructor', '\u0000', '\ud800', '𝔰𝔥𝔯𝔦𝔫𝔨', ''),
  fc.integer({ min: 1, max: 3000 }).map((depth) => {
    let v: Json = 1;
    for (let i = 0; i < depth; i++) v = [v];
    return v;
  }),
  fc.array(fc.double(), { maxLength: 200 }).map((xs) => xs.map((x) => (Number.isFinite(x) ? x : null))),
);

/** Replace or delete the value at a random path of a valid body. */
function mutate(body: Json, choices: number[], replacement: Json, drop: boolean): Json {
  const copy = structuredClone(body);
  let node: Json = copy;
  for (const choice of choices) {
    if (node === null || typeof node !== 'object') break;
    const keys = Object.keys(node);
    if (keys.length === 0) break;
    const key = keys[choice % keys.length];
    const child = (node as Record<string, Json>)[key];
    if (child === null || typeof child !== 'object' || choice % 3 === 0) {
      if (drop) {
        if (Array.isArray(node)) node.splice(Number(key), 1);
        else delete (node as Record<string, Json>)[key];
      } else {
        (node as Record<string, Json>)[key] = replacement;
      }
      return copy;
    }
    node = child;
  }
  return drop ? copy : replacement;
}

const brokenText = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.constantFrom('{', '{"data":', '[1,2', '{"a":1e999}', 'null', '"x"', '{"__proto__":{"x":1}}',
    '{"constructor":{"prototype":{"x":1}}}', '[' .repeat(100_000), '{"data":{"columns":{"y":[1e400]}}}', '\ufeff{}'),
);

t.test('every POST route answers malformed bodies with 4xx problem+json', async (t) => {
  const { app } = await buildTestApp(t, { rateLimitPerMinute: 1_000_000, eventLoopMaxDelayMs: 0 });
  const create = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: demoComparison() });
  const id = create.json().id as string;
  const posts = [...new Set(app.registeredRoutes.filter((r) => r.method === 'POST').map((r) => r.url))];
  t.ok(posts.includes('/v1/comparisons'), `POST routes under test: ${posts.join(', ')}`);

  for (const route of posts) {
    const url = route.replace(/:id\b/g, id);
    const valid = validBody(route);
    const failures: string[] = [];
    let accepted = 0;
    const check = async (payload: string, label: string) => {
      const res = await app.inject({ method: 'POST', url, payload, headers: { 'content-type': 'application/json' } });
      if (res.statusCode >= 200 && res.statusCode < 300) { accepted++; return true; }
      const ok = res.statusCode >= 400 && res.statusCode < 500
        && /^application\/problem\+json/.test(String(res.headers['content-type']))
        && res.json().status === res.statusCode;
      if (!ok) failures.push(`${label}: ${res.statusCode} ${res.body.slice(0, 300)} <- ${payload.slice(0, 200)}`);
      return ok;
    };
    await fc.assert(fc.asyncProperty(
      fc.oneof(
        nasty.map((v) => ({ text: JSON.stringify(v), label: 'arbitrary JSON' })),
        fc.tuple(fc.array(fc.nat(), { minLength: 1, maxLength: 6 }), nasty, fc.boolean())
          .map(([choices, v, drop]) => ({ text: JSON.stringify(mutate(valid, choices, v, drop)), label: drop ? 'dropped key' : 'replaced value' })),
        brokenText.map((text) => ({ text, label: 'broken JSON text' })),
      ),
      // Failures are collected rather than thrown so the report lists them all.
      async ({ text, label }) => { await check(text, label); },
    ), { numRuns: RUNS, seed: 20261207 });
    t.same(failures.slice(0, 5), [], `POST ${route}: ${RUNS} malformed bodies, no 5xx, every refusal a 4xx problem (${accepted} mutations were still valid and answered 2xx)`);
  }
  t.equal((await app.inject('/healthz')).statusCode, 200, 'still up');
});
