// Generalised-linear searches through POST /v1/searches, checked against R:
// every subset of a small pool fitted by R's glm (test/reference/glm/
// glm-search-reference.json, made by scripts/glm-search-reference.R; R and
// MASS versions in its "source"), and against POST /v1/comparisons (a
// search's best models sent back as candidates score the same).
import { readFileSync } from 'node:fs';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import type { Term } from '../../src/core/types.ts';

interface RSubset { pool: number[]; logLikelihood: number; parameters: number; aic: number; bic: number; aicc: number; deviance: number; coefficients: number[] }
interface RCase { family: string; link: string; offset: string | null; trials: string | null; columns: Record<string, (number | string)[]>; subsets: RSubset[] }
const REFERENCE = JSON.parse(readFileSync(new URL('../reference/glm/glm-search-reference.json', import.meta.url), 'utf8')) as Record<string, RCase> & { source: string };

/** R's family name as the service spells it. */
const serviceFamily = (f: string) => (f === 'Gamma' ? 'gamma' : f);

const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));

/** The service's terms for each case's pool, in the R script's pool order. */
const POOLS: Record<string, { response: string; pool: Term[] }> = {
  defects: { response: 'defects', pool: ['peakTemp', 'holdMinutes', 'moisture', 'glazeMicrons', { kind: 'factor', of: 'kiln' }] },
  cracks: { response: 'cracked', pool: ['peakTemp', 'moisture', 'holdMinutes', 'glazeMicrons'] },
  strength: { response: 'strength', pool: ['peakTemp', 'moisture', 'holdMinutes'] },
};

function searchBody(name: string, extra: Record<string, unknown> = {}) {
  const c = REFERENCE[name];
  const { response, pool } = POOLS[name];
  return {
    data: { columns: c.columns }, response, pool, family: serviceFamily(c.family), link: c.link,
    ...(c.offset ? { offset: c.offset } : {}), ...(c.trials ? { trials: c.trials } : {}),
    top: 2 ** pool.length, rankBy: 'aic', ...extra,
  };
}

const key = (terms: Term[]) => JSON.stringify(terms);

t.test(`every subset against R's glm (${REFERENCE.source})`, async (t) => {
  const { app } = await buildTestApp(t);
  for (const name of ['defects', 'cracks', 'strength']) {
    const c = REFERENCE[name];
    const { pool } = POOLS[name];
    const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: searchBody(name) });
    t.equal(res.statusCode, 200, res.statusCode === 200 ? name : `${name}: ${res.body.slice(0, 500)}`);
    const body = res.json();
    t.equal(body.method, 'exhaustive', `${name}: a small pool is fitted subset by subset`);
    t.equal(body.proven, true, `${name}: proven`);
    t.equal(body.evaluated, 2 ** pool.length, `${name}: every subset scored`);
    t.equal(body.glm.family, serviceFamily(c.family));
    t.equal(body.models.length, c.subsets.length, `${name}: every subset listed`);
    const byTerms = new Map(body.models.map((m: { terms: Term[] }) => [key(m.terms), m]));
    const best = Math.min(...c.subsets.map((s) => s.aic));
    const total = c.subsets.reduce((acc, s) => acc + Math.exp(-(s.aic - best) / 2), 0);
    let worstLogL = 0;
    let worstWeight = 0;
    for (const s of c.subsets) {
      const m = byTerms.get(key(s.pool.map((j) => pool[j]))) as { logLikelihood: number; aic: number; bic: number; aicc: number; parameters: number; deviance: number; weight: number; coefficients: { estimate: number }[] } | undefined;
      if (!m) {
        t.fail(`${name}: subset ${s.pool} missing`);
        continue;
      }
      worstLogL = Math.max(worstLogL, relative(m.logLikelihood, s.logLikelihood));
      t.equal(m.parameters, s.parameters, `${name} ${s.pool}: k counts what R counts (the gamma shape too)`);
      t.ok(relative(m.aic, s.aic) < 1e-9 && relative(m.bic, s.bic) < 1e-9 && relative(m.aicc, s.aicc) < 1e-9, `${name} ${s.pool}: AIC, BIC, AICc to 1e-9`);
      t.ok(relative(m.deviance, s.deviance) < 1e-9, `${name} ${s.pool}: deviance`);
      t.ok(m.coefficients.every((x, j) => relative(x.estimate, s.coefficients[j]) < 1e-7), `${name} ${s.pool}: coefficients to 1e-7`);
      worstWeight = Math.max(worstWeight, Math.abs(m.weight - Math.exp(-(s.aic - best) / 2) / total));
    }
    t.ok(worstLogL < 1e-10, `${name}: log-likelihoods to 1e-10 (worst ${worstLogL})`);
    t.ok(worstWeight < 1e-8, `${name}: Akaike weights over every subset from R's AICs to 1e-8 (worst ${worstWeight})`);
  }
});

t.test('the best models score exactly as the same candidates in a comparison', async (t) => {
  const { app } = await buildTestApp(t);
  // The R cases, and the strength data once more as inverse Gaussian (its dispersion counted in k).
  const runs: [string, { family?: string; link?: string }][] = [['defects', {}], ['cracks', {}], ['strength', {}], ['strength', { family: 'inverseGaussian', link: 'log' }]];
  for (const [name, model] of runs) {
    const c = REFERENCE[name];
    const family = model.family ?? serviceFamily(c.family);
    const link = model.link ?? c.link;
    const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: searchBody(name, { top: 3, family, link }) });
    t.equal(res.statusCode, 200);
    const models = res.json().models as { name: string; terms: Term[]; logLikelihood: number; aic: number; parameters: number }[];
    t.equal(models.length, 3, `${name} ${family}: three best`);
    const candidates = models.map((m, i) => ({ name: `best-${i}`, terms: m.terms, family, link, ...(c.offset ? { offset: c.offset } : {}) }));
    const compared = await app.inject({
      method: 'POST', url: '/v1/comparisons',
      payload: { data: { columns: c.columns }, response: POOLS[name].response, ...(c.trials ? { trials: c.trials } : {}), candidates },
    });
    t.equal(compared.statusCode, 200, compared.statusCode === 200 ? name : compared.body.slice(0, 400));
    compared.json().models.forEach((m: { logLikelihood: number; aic: number; parameters: number }, i: number) => {
      t.ok(Math.abs(m.logLikelihood - models[i].logLikelihood) <= 1e-9 * Math.abs(m.logLikelihood), `${name} ${family} #${i}: same log-likelihood`);
      t.ok(Math.abs(m.aic - models[i].aic) <= 1e-9 * Math.abs(m.aic), `${name} ${family} #${i}: same AIC`);
      t.equal(m.parameters, models[i].parameters, `${name} ${family} #${i}: same k`);
    });
  }
});

t.test('a stored GLM search replays identically and is drawn and written up', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({ method: 'POST', url: '/v1/searches', payload: searchBody('strength', { top: 4 }) });
  t.equal(res.statusCode, 200);
  const id = res.json().id;
  const replay = await app.inject({ method: 'POST', url: `/v1/searches/${id}/replay` });
  t.equal(replay.statusCode, 200, replay.body.slice(0, 300));
  t.equal(replay.json().identical, true, JSON.stringify(replay.json().changes).slice(0, 300));
  for (const what of ['chart.svg', 'report']) {
    const page = await app.inject({ method: 'GET', url: `/v1/searches/${id}/${what}` });
    t.equal(page.statusCode, 200, `${what}: ${page.body.slice(0, 200)}`);
  }
  const report = await app.inject({ method: 'GET', url: `/v1/searches/${id}/report` });
  t.match(report.body, /every subset scored/, 'the report names the method');
});
