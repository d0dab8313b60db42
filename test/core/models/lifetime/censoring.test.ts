// Reading and checking censored observations, and the issues a lifetime
// candidate reports instead of a fit: every problem is data with a path and
// a plain message, never a throw.
import t from 'tap';
import {
  censoredResponse, censoringCounts, checkLifetimeOptions, fitLifetime, isCensored, uncensoredResponse,
} from '../../../../src/core/models/lifetime/index.ts';
import { design } from './fixtures.ts';

const columns = {
  hours: [120, 340, 410, 0, 95, 610, 200],
  state: ['exact', 'right', 'interval', 'interval', 'left', 'right', 'exact'],
  until: [null, null, 480, 60, null, null, null],
  kiln: ['a', 'b', 'a', 'b', 'a', 'b', 'a'],
};
const rows = [0, 1, 2, 3, 4, 5, 6];

t.test('statuses, the upper column read on interval rows only, counts', async (t) => {
  const r = censoredResponse(columns, 'hours', { status: 'state', upper: 'until' }, rows);
  if ('issues' in r) throw new Error(JSON.stringify(r.issues));
  t.same(Array.from(r.response.status), [0, 1, 3, 3, 2, 1, 0]);
  t.same(Array.from(r.response.upper).map((v) => (Number.isNaN(v) ? null : v)), [null, null, 480, 60, null, null, null], 'nulls elsewhere drop nothing');
  t.same(censoringCounts(r.response), { exact: 2, right: 2, left: 1, interval: 2 });
  t.ok(isCensored(r.response));
  t.notOk(isCensored(uncensoredResponse(Float64Array.of(1, 2), [0, 1], 'hours')));
  const plain = censoredResponse(columns, 'hours', null, rows);
  t.ok('response' in plain && !isCensored(plain.response), 'without censoring every row is exact');
});

t.test('each problem with the field it concerns', async (t) => {
  const codes = (c: Record<string, unknown[]>, censoring: { status: string; upper?: string }) => {
    const r = censoredResponse({ ...columns, ...c } as any, 'hours', censoring, rows);
    return 'issues' in r ? r.issues.map((i) => [i.code, i.path.join('/'), (i as any).row]) : [];
  };
  t.same(codes({}, { status: 'nope' }), [['unknown_column', 'censoring/status', undefined]]);
  t.same(codes({}, { status: 'state', upper: 'nope' }), [['unknown_column', 'censoring/upper', undefined]]);
  t.same(codes({ state: ['exact', 'broken', 'exact', 'exact', 'exact', 'exact', 'exact'] }, { status: 'state' }), [['censoring_status_unknown', 'censoring/status', 1]]);
  t.same(codes({}, { status: 'state' }), [['censoring_upper_missing', 'censoring', 2], ['censoring_upper_missing', 'censoring', 3]], 'interval rows need an upper column');
  t.same(codes({ until: [null, null, null, 60, null, null, null] }, { status: 'state', upper: 'until' }), [['censoring_upper_missing', 'censoring/upper', 2]]);
  t.same(codes({ until: [null, null, 'late', 60, null, null, null] }, { status: 'state', upper: 'until' }), [['censoring_upper_not_numeric', 'censoring/upper', 2]]);
  t.same(codes({ until: [null, null, 410, 60, null, null, null] }, { status: 'state', upper: 'until' }), [['censoring_upper_not_above', 'censoring/upper', 2]], 'upper equal to the response is not above it');
  t.same(codes({ hours: [120, 'x', 410, 0, 95, 610, 200] }, { status: 'state', upper: 'until' }), [['response_not_numeric', 'response', 1]]);
  const r = censoredResponse(columns, 'hours', { status: 'state', upper: 'nope' }, rows);
  t.match('issues' in r && r.issues[0].message, /censoring\/upper refers to column "nope"/);
  const bad = censoredResponse({ ...columns, state: ['exact', 'broken', 'exact', 'exact', 'exact', 'exact', 'exact'] }, 'hours', { status: 'state' }, rows);
  t.match('issues' in bad && bad.issues[0].message, /holds "broken" at row 1; a censoring status is one of "exact", "right", "left" or "interval"/);
});

t.test('a distribution of positive time refuses a time of 0 or less; the time-scale ones accept it', async (t) => {
  const c = { hours: [120, -5, 410, 0, 95], state: ['exact', 'exact', 'interval', 'interval', 'right'], until: [null, null, 480, 60, null] };
  const r = censoredResponse(c, 'hours', { status: 'state', upper: 'until' }, [0, 1, 2, 3, 4]);
  if ('issues' in r) throw new Error('read');
  const X = design(c, [], [0, 1, 2, 3, 4]);
  const f = fitLifetime({ name: 'w', distribution: 'weibull', design: X }, r.response, {}, ['candidates', 2]);
  t.ok('issues' in f);
  if ('issues' in f) {
    t.equal(f.issues[0].code, 'lifetime_time_not_positive');
    t.same(f.issues[0].path, ['candidates', 2, 'distribution']);
    t.match(f.issues[0].message, /holds -5 at row 1 \(an exact failure\)/);
  }
  // An interval from 0 is a unit found failed at its first inspection: allowed.
  const ok = censoredResponse({ ...c, hours: [120, 5, 410, 0, 95] }, 'hours', { status: 'state', upper: 'until' }, [0, 1, 2, 3, 4]);
  if ('issues' in ok) throw new Error('read');
  t.notOk('issues' in fitLifetime({ name: 'w', distribution: 'weibull', design: X }, ok.response), 'an interval starting at 0 fits');
  t.notOk('issues' in fitLifetime({ name: 'n', distribution: 'normal', design: X }, r.response), 'the normal takes negative times');
});

t.test('no failures, or only left-censored units: the parameters that cannot be estimated are named', async (t) => {
  const c = { hours: [100, 200, 300, 400], kiln: ['a', 'b', 'a', 'b'] };
  const right = { rows: [0, 1, 2, 3], time: Float64Array.from(c.hours), upper: new Float64Array(4).fill(NaN), status: Uint8Array.of(1, 1, 1, 1), timeColumn: 'hours', upperColumn: null };
  const X0 = design(c, [], [0, 1, 2, 3]);
  const f = fitLifetime({ name: 'w', distribution: 'weibull', design: X0 }, right, {}, ['candidates', 0]);
  t.ok('issues' in f && f.issues[0].code === 'lifetime_no_failures');
  if ('issues' in f) {
    t.same((f.issues[0] as any).notEstimable, ['scale', 'shape']);
    t.match(f.issues[0].message, /all 4 units are right-censored/);
  }
  const X1 = design(c, ['kiln'], [0, 1, 2, 3]);
  const left = { ...right, status: Uint8Array.of(2, 2, 2, 2) };
  const g = fitLifetime({ name: 'ln', distribution: 'lognormal', design: X1 }, left);
  t.ok('issues' in g && g.issues[0].code === 'lifetime_only_left_censored');
  if ('issues' in g) t.same((g.issues[0] as any).notEstimable, ['intercept', 'kiln=b', 'sdlog']);
});

t.test('an unknown distribution and invalid options', async (t) => {
  const X = design({ h: [1, 2, 3] }, [], [0, 1, 2]);
  const r = uncensoredResponse(Float64Array.of(1, 2, 3), [0, 1, 2], 'h');
  const f = fitLifetime({ name: 'x', distribution: 'frechet', design: X }, r, {}, ['candidates', 1]);
  t.ok('issues' in f && f.issues[0].code === 'lifetime_distribution_unknown');
  if ('issues' in f) t.same(f.issues[0].path, ['candidates', 1, 'distribution']);
  const issues = checkLifetimeOptions({ percentiles: [0.1, 1, 0], survivalAt: [5, Infinity], intervalLevel: 1.2, maxIterations: 0.5 });
  t.same(issues.map((i) => i.path.join('/')), ['options/percentiles/1', 'options/percentiles/2', 'options/survivalAt/1', 'options/intervalLevel', 'options/maxIterations']);
  t.same(checkLifetimeOptions({ percentiles: [0.5], survivalAt: [-1, 0], intervalLevel: 0.9, maxIterations: 10 }), []);
});

t.test('a likelihood without a maximum is a named non-convergence, never a fit', async (t) => {
  // Two failures at the same time and a unit censored before them: the
  // Weibull's scale can shrink to 0 around the failures and the likelihood
  // grows without bound.
  const c = { hours: [50, 50, 30] };
  const r = { rows: [0, 1, 2], time: Float64Array.from(c.hours), upper: new Float64Array(3).fill(NaN), status: Uint8Array.of(0, 0, 1), timeColumn: 'hours', upperColumn: null };
  const f = fitLifetime({ name: 'too-few', distribution: 'weibull', design: design(c, [], [0, 1, 2]) }, r, {}, ['candidates', 3]);
  t.ok('issues' in f);
  if ('issues' in f) {
    t.equal(f.issues[0].code, 'lifetime_not_converged');
    t.same(f.issues[0].path, ['candidates', 3]);
    t.match(f.issues[0].message, /"too-few", weibull\) did not reach a maximum/);
  }
  // A factor level whose units all outlived the test: its coefficient runs away.
  const d = { hours: [10, 20, 15, 30, 100, 100, 100], kiln: ['a', 'a', 'a', 'a', 'b', 'b', 'b'] };
  const s = { rows: [0, 1, 2, 3, 4, 5, 6], time: Float64Array.from(d.hours), upper: new Float64Array(7).fill(NaN), status: Uint8Array.of(0, 0, 0, 0, 1, 1, 1), timeColumn: 'hours', upperColumn: null };
  const g = fitLifetime({ name: 'runaway', distribution: 'lognormal', design: design(d, ['kiln'], [0, 1, 2, 3, 4, 5, 6]) }, s);
  t.ok('issues' in g && g.issues[0].code === 'lifetime_not_converged', 'not a ranking');
  if ('issues' in g) t.equal((g.issues[0] as any).reason, 'estimates_diverge');
});

t.test('every message names its path', async (t) => {
  const r = censoredResponse(columns, 'hours', { status: 'state' }, rows);
  if ('issues' in r) for (const i of r.issues) t.ok(i.message.startsWith(i.path.join('/')), i.message);
});
