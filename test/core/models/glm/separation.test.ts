// Separation: the maximum-likelihood estimates do not exist, so the fit is an
// issue naming the terms whose coefficients run to infinity, never a huge
// finite estimate. Each data set is built so that the separating direction
// is known by construction (common practice: Albert & Anderson 1984 for
// complete and quasi-complete separation of binary data; Haberman 1974 for a
// factor level whose counts are all zero).
import t from 'tap';
import { quickFit } from './glm-fixtures.ts';

function separatedTerms(outcome: ReturnType<typeof quickFit>): string[] | null {
  if (!('issues' in outcome)) return null;
  const found = outcome.issues.find((i) => i.code === 'glm_separation');
  return found && found.code === 'glm_separation' ? found.terms : null;
}

t.test('complete separation by a covariate, every binomial link that can separate', async (t) => {
  for (const link of ['logit', 'probit', 'cloglog'] as const) {
    const outcome = quickFit({ columns: { load: [1, 2, 3, 4, 5, 6] }, terms: ['load'], family: 'binomial', link, y: [0, 0, 0, 1, 1, 1] });
    t.same(separatedTerms(outcome), ['intercept', 'load'], link);
    if ('issues' in outcome) {
      t.same(outcome.issues[0].path, ['candidates', 0]);
      t.match(outcome.issues[0].message, /candidates\/0: the binomial likelihood keeps rising as the coefficients of "intercept", "load" run to infinity/);
    }
  }
});

t.test('quasi-complete separation: rows tied at the boundary value overlap', async (t) => {
  // load < 3: all failures; load > 3: all passes; at load = 3 both occur.
  const outcome = quickFit({
    columns: { load: [1, 2, 3, 3, 3, 4, 5, 6], humidity: [0.3, 0.1, 0.5, 0.2, 0.9, 0.4, 0.8, 0.6] },
    terms: ['load', 'humidity'], family: 'binomial', y: [0, 0, 0, 1, 1, 1, 1, 1],
  });
  t.same(separatedTerms(outcome), ['intercept', 'load'], 'humidity is not involved');
  if ('issues' in outcome && outcome.issues[0].code === 'glm_separation') t.equal(outcome.issues[0].rows, 5, 'the five rows away from load = 3');
});

t.test('a factor level with no successes (binomial) or no counts (Poisson, negative binomial)', async (t) => {
  const kiln = ['east', 'east', 'east', 'north', 'north', 'north', 'west', 'west', 'west', 'east', 'west'];
  t.same(separatedTerms(quickFit({
    columns: { kiln, hours: [1, 2, 3, 1, 2, 3, 1, 2, 3, 4, 4] }, terms: ['kiln', 'hours'], family: 'binomial',
    y: [0, 1, 1, 0, 0, 0, 1, 0, 1, 1, 0],
  })), ['kiln=north']);
  t.same(separatedTerms(quickFit({ columns: { kiln }, terms: ['kiln'], family: 'poisson', y: [3, 1, 4, 0, 0, 0, 2, 5, 1, 2, 6] })), ['kiln=north']);
  t.same(separatedTerms(quickFit({ columns: { kiln }, terms: ['kiln'], family: 'negativeBinomial', y: [3, 1, 14, 0, 0, 0, 2, 15, 1, 0, 9] })), ['kiln=north']);
  // With trials: a level whose successes equal its trials runs the other way.
  t.same(separatedTerms(quickFit({
    columns: { kiln: ['east', 'east', 'north', 'north', 'west', 'west'] }, terms: ['kiln'], family: 'binomial',
    y: [3, 5, 8, 6, 2, 4], trials: [10, 10, 8, 6, 10, 10],
  })), ['kiln=north']);
});

t.test('overlapping data are not separated: finite estimates, converged', async (t) => {
  const outcome = quickFit({ columns: { load: [1, 2, 3, 4, 5, 6, 7, 8] }, terms: ['load'], family: 'binomial', y: [0, 0, 1, 0, 1, 0, 1, 1] });
  t.notOk('issues' in outcome);
  if (!('issues' in outcome)) {
    t.equal(outcome.convergence.converged, true);
    t.ok(outcome.coefficients.every((c) => Math.abs(c.estimate!) < 10));
  }
  // A single overlapping row is enough to keep the estimates finite.
  const nearly = quickFit({ columns: { load: [1, 2, 3, 4, 5, 6] }, terms: ['load'], family: 'binomial', y: [0, 0, 1, 0, 1, 1] });
  t.notOk('issues' in nearly, 'one overlap: the maximum exists');
  // Zero counts spread over the levels do not separate a Poisson model.
  const spread = quickFit({ columns: { kiln: ['a', 'a', 'b', 'b', 'c', 'c'] }, terms: ['kiln'], family: 'poisson', y: [0, 2, 0, 1, 3, 0] });
  t.notOk('issues' in spread);
});
