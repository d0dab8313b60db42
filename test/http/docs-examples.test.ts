// /docs: every operation is described, every operation that takes a body has
// a worked example that the service answers with 200 (what "Try it out" sends),
// and the page carries the service's own title and icon, not the library's
// header. The examples are read from the served document, as the page reads them.
import t from 'tap';
import { buildTestApp } from '../helper.ts';

type Media = { examples?: Record<string, { value: unknown }> };
type Operation = { description?: string; requestBody?: { content: Record<string, Media> }; parameters?: { name: string; example?: unknown }[] };

async function servedDocument(t: Parameters<typeof buildTestApp>[0]) {
  // The expression example is priced above COMPUTE_INLINE_WORK (a nonlinear fit at its iteration cap); the answers, not their place, are checked here.
  const built = await buildTestApp(t, { computeInlineWork: 1e12 });
  const doc = (await built.app.inject({ method: 'GET', url: '/openapi.json' })).json() as { paths: Record<string, Record<string, Operation>> };
  return { ...built, doc };
}

t.test('every operation has a description', async (t) => {
  const { doc } = await servedDocument(t);
  for (const [path, operations] of Object.entries(doc.paths)) {
    for (const [method, operation] of Object.entries(operations)) {
      t.ok((operation.description ?? '').length > 40, `${method.toUpperCase()} ${path} is described`);
    }
  }
});

t.test('the worked examples of POST /v1/comparisons and POST /v1/searches succeed as sent', async (t) => {
  const { app, doc } = await servedDocument(t);
  for (const path of ['/v1/comparisons', '/v1/searches']) {
    const examples = doc.paths[path].post.requestBody?.content['application/json'].examples ?? {};
    t.ok(Object.keys(examples).length > 0, `${path} has an example`);
    for (const [name, example] of Object.entries(examples)) {
      const res = await app.inject({ method: 'POST', url: path, payload: example.value as object });
      t.equal(res.statusCode, 200, `${path} example ${name}: ${res.body.slice(0, 300)}`);
      t.match(res.json().id, /^[0-9a-f-]{36}$/, 'recorded');
    }
  }
  const comparison = doc.paths['/v1/comparisons'].post.requestBody!.content['application/json'].examples!.demo.value as { candidates: { name: string }[]; data: { columns: Record<string, unknown[]> } };
  t.same(comparison.candidates.map((c) => c.name), ['temperature', 'curved-temperature', 'curve+moisture+kiln', 'curve+moisture+kiln+hold', 'everything-by-kiln'], 'the demo scenario\'s candidates');
  t.equal(comparison.data.columns.shrinkage.length, 24);
});

t.test('the expression example: a mechanistic model ranked beside polynomials, predictions averaged across both kinds', async (t) => {
  const { app, doc } = await servedDocument(t);
  const example = doc.paths['/v1/comparisons'].post.requestBody!.content['application/json'].examples!.expression;
  t.ok(example, 'POST /v1/comparisons has an expression example');
  const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: example.value as object });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const body = res.json();
  const mechanistic = body.models.find((m: { name: string }) => m.name === 'approach-to-plateau');
  t.equal(mechanistic.expression, 'base + gain*(1 - exp(-rate*holdMinutes))');
  t.equal(mechanistic.convergence.converged, true);
  t.same(mechanistic.coefficients.map((c: { term: string }) => c.term), ['base', 'gain', 'rate'], 'one coefficient per parameter');
  t.equal(mechanistic.parameters, 4, 'k = three parameters + the error variance');
  t.ok(body.conventions.nonlinear, 'the nonlinear convention is stated');
  // The soak data are drawn from this very form (src/demo-soak.ts), so the criteria should find it; they rank, they do not validate.
  t.equal(body.rankings.aicc[0].name, 'approach-to-plateau', 'the generating form ranks first by AICc');
  const rate = mechanistic.coefficients[2];
  t.ok(rate.lower < 0.12 && 0.12 < rate.upper, 'the interval for the rate holds the rate the data were drawn with (0.12 per minute)');
  t.equal(body.averaged.predictions.length, 3, 'averaged across the nonlinear and the linear models');
  t.ok(body.cautions.some((c: { message: string }) => /do not validate/i.test(c.message)), 'the answer says that criteria rank, not validate');
});

t.test('the worked examples of POST /v1/summaries succeed as NDJSON and as CSV, with the same summary', async (t) => {
  const { app, doc } = await servedDocument(t);
  const operation = doc.paths['/v1/summaries'].post;
  const columns = operation.parameters?.find((p) => p.name === 'columns')?.example;
  t.equal(columns, 'peakTemp,holdMinutes,moisture,shrinkage');
  const answers = [];
  for (const type of ['application/x-ndjson', 'text/csv']) {
    const body = operation.requestBody?.content[type].examples?.demo.value;
    t.type(body, 'string', `${type} example`);
    const res = await app.inject({ method: 'POST', url: `/v1/summaries?columns=${columns}`, headers: { 'content-type': type }, payload: String(body) });
    t.equal(res.statusCode, 200, `${type}: ${res.body.slice(0, 300)}`);
    answers.push(res.json());
  }
  t.same(answers[0].summary, answers[1].summary, 'both forms carry the same rows');
  t.equal(answers[0].rowsRead, 24);
  t.equal(answers[0].rowsDropped, 1, 'the firing whose moisture reading was lost');
});

t.test('/docs: the service\'s title and icon, the library\'s top bar and logo left out', async (t) => {
  const { app } = await buildTestApp(t);
  const page = await app.inject({ method: 'GET', url: '/docs/' });
  t.equal(page.statusCode, 200);
  t.match(page.body, /<title>parsimetry · API documentation<\/title>/);
  t.notMatch(page.body, /Swagger UI<\/title>/);
  t.match(page.body, /rel="icon" type="image\/svg\+xml" href="[^"]*theme\/parsimetry\.svg"/);
  t.notMatch(page.body, /favicon-32x32\.png/, 'not the library\'s icon');
  const initializer = await app.inject({ method: 'GET', url: '/docs/static/swagger-initializer.js' });
  t.match(initializer.body, /"layout":\s*"BaseLayout"/, 'the layout without the top bar (logo and URL box)');
  const icon = await app.inject({ method: 'GET', url: '/docs/static/theme/parsimetry.svg' });
  t.equal(icon.statusCode, 200);
  t.match(icon.headers['content-type'], /^image\/svg\+xml/);
});
