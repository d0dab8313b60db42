// examples/fingerprint.py (Python's standard library only) against the
// service's dataset.fingerprint for the columns beyond terms: a generalised
// linear candidate's offset, the request's trials, the data columns an
// expression names, and the censoring status and upper columns (the upper
// column, null on rows that are not interval-censored, is hashed as text and
// drops no row). Each request leaves a column out or drops a row in a way the
// script must follow, so a script that ignored these columns would disagree.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import t from 'tap';
import { buildTestApp } from '../helper.ts';
import { referenceCase } from '../core/models/glm/reference-data.ts';
import { solderJoints, SOLDER_TERMS } from '../core/models/lifetime/fixtures.ts';

const seams = referenceCase('seams-poisson-offset');
const beetles = referenceCase('beetle-logit');
const kilnDrying = JSON.parse(readFileSync(new URL('../reference/nonlinear/kiln-drying-r.json', import.meta.url), 'utf8'));

const python = (request: object) => execFileSync('python3', ['examples/fingerprint.py'], { input: JSON.stringify(request) }).toString().trim();

/** The first value of a column made missing, so only a script reading that column drops the row. */
function withGap(columns: Record<string, unknown[]>, name: string, row = 0) {
  return { ...columns, [name]: columns[name].map((v, i) => (i === row ? null : v)) };
}

const requests: [string, object][] = [
  ['a Poisson with an offset (missing on row 0)', {
    data: { columns: withGap(seams.data, 'logLength') }, response: seams.response,
    candidates: [{ name: 'per-length', terms: seams.terms, family: 'poisson', offset: 'logLength' }, { name: 'current-only', terms: ['current'], family: 'poisson', offset: 'logLength' }],
  }],
  ['a binomial with trials beside a Poisson', {
    data: { columns: { ...beetles.data, batch: beetles.data.dose.map((_, i) => (i === 2 ? null : `b${i}`)) } }, response: beetles.response, trials: beetles.trials,
    candidates: [{ name: 'logit', terms: beetles.terms, family: 'binomial' }, { name: 'counts', terms: beetles.terms, family: 'poisson' }],
  }],
  ['a nonlinear expression naming a column (missing on row 0) and a parameter', {
    data: { columns: withGap({ hours: kilnDrying.data.hours, moisture: kilnDrying.data.moisture, unused: kilnDrying.data.hours.map(() => null) }, 'hours') }, response: 'moisture',
    candidates: [
      { name: 'equilibrium', expression: 'eq + (m0 - eq)*exp(-k*hours)', start: { eq: 5, m0: 40, k: 0.03 } },
      { name: 'decay', expression: 'm0*exp(-k * hours)', starts: [{ m0: 40, k: 0.03 }, { m0: 30, k: 0.05 }] },
    ],
  }],
  ['life data with censoring status and upper columns', {
    data: { columns: solderJoints() }, response: 'cycles', censoring: { status: 'status', upper: 'upper' },
    candidates: [{ name: 'weibull', distribution: 'weibull', terms: SOLDER_TERMS }, { name: 'lognormal', distribution: 'lognormal', terms: SOLDER_TERMS }],
  }],
];

t.test('examples/fingerprint.py reads offsets, trials, expression columns and censoring columns', async (t) => {
  const { app } = await buildTestApp(t);
  for (const [what, request] of requests) {
    const res = await app.inject({ method: 'POST', url: '/v1/comparisons', payload: request });
    t.equal(res.statusCode, 200, `${what}: ${res.body.slice(0, 200)}`);
    const body = res.json();
    t.equal(python(request), body.dataset.fingerprint, `${what}: the script computes the service's fingerprint`);
  }
  // The rows the script drops are the service's: row 0 of the offset case is gone from both.
  const offset = (await app.inject({ method: 'POST', url: '/v1/comparisons', payload: requests[0][1] })).json();
  t.equal(offset.dataset.rowsDropped, 1, 'the missing offset drops its row');
});
