// What a caller can get wrong with a generalised linear model, reported as
// issues that name the field and the data row; never a throw, never a fit.
import t from 'tap';
import { fitGlm } from '../../../../src/core/models/glm/index.ts';
import { design, quickFit } from './glm-fixtures.ts';

function only(outcome: ReturnType<typeof quickFit>) {
  if (!('issues' in outcome)) throw new Error('expected an issue');
  return outcome.issues[0];
}

t.test('link and family pairs', async (t) => {
  const i = only(quickFit({ columns: { x: [1, 2, 3, 4] }, terms: ['x'], family: 'binomial', link: 'identity', y: [0, 1, 0, 1] }));
  t.equal(i.code, 'glm_link_not_allowed');
  t.same(i.path, ['candidates', 0, 'link']);
  t.match(i.message, /candidates\/0\/link asks for the identity link with the binomial family, which admits only "logit", "probit", "cloglog", "log"/);
  for (const [family, link] of [['gamma', 'logit'], ['poisson', 'inverse'], ['inverseGaussian', 'sqrt'], ['gaussian', 'probit']] as const) {
    t.equal(only(quickFit({ columns: { x: [1, 2, 3, 4] }, terms: ['x'], family, link, y: [1, 2, 3, 4] })).code, 'glm_link_not_allowed', `${family}/${link}`);
  }
  // Canonical links by default (the contract): logit, log, log, inverse, inverseSquare, identity.
  const canonical = { binomial: 'logit', poisson: 'log', negativeBinomial: 'log', gamma: 'inverse', inverseGaussian: 'inverseSquare', gaussian: 'identity' } as const;
  const y = { binomial: [0, 1, 0, 1, 1, 0], poisson: [1, 3, 2, 5, 4, 7], negativeBinomial: [0, 9, 1, 14, 2, 30], gamma: [1.2, 2.5, 1.9, 3.1, 2.2, 4.0], inverseGaussian: [1.2, 2.5, 1.9, 3.1, 2.2, 4.0], gaussian: [1.2, 2.5, 1.9, 3.1, 2.2, 4.0] };
  for (const [family, link] of Object.entries(canonical) as [keyof typeof canonical, string][]) {
    const outcome = quickFit({ columns: { x: [1, 2, 3, 4, 5, 6] }, terms: ['x'], family, y: y[family] });
    t.equal('issues' in outcome ? outcome.issues[0].message : outcome.link, link, `${family} defaults to ${link}`);
  }
});

t.test('responses outside the family\'s support name the row', async (t) => {
  const x = { x: [1, 2, 3, 4] };
  let i = only(quickFit({ columns: x, terms: ['x'], family: 'poisson', y: [0, 1.5, 0, 1] }));
  t.equal(i.code, 'glm_count_not_integer');
  t.match(i.message, /^response holds 1.5 at row 1; the poisson family models counts/);
  i = only(quickFit({ columns: x, terms: ['x'], family: 'negativeBinomial', y: [0, 2, -1, 1] }));
  t.equal(i.code, 'glm_response_outside_support');
  t.match(i.message, /row 2/);
  i = only(quickFit({ columns: x, terms: ['x'], family: 'binomial', y: [0, 2, 0, 1] }));
  t.equal(i.code, 'glm_response_outside_support', '0/1 without trials');
  t.match(i.message, /0 or 1 \(send trials to model counts of successes\)/);
  i = only(quickFit({ columns: x, terms: ['x'], family: 'binomial', y: [0, 3, 0, 1], trials: [2, 2, 2, 2] }));
  t.equal(i.code, 'glm_successes_above_trials');
  t.match(i.message, /^response has 3 successes at row 1, more than its 2 trials/);
  i = only(quickFit({ columns: x, terms: ['x'], family: 'binomial', y: [0, 1, 0, 1], trials: [2, 0, 2, 2] }));
  t.equal(i.code, 'glm_trials_invalid');
  t.same(i.path, ['trials']);
  i = only(quickFit({ columns: x, terms: ['x'], family: 'binomial', y: [0, 1, 0, 1], trials: [2, 2.5, 2, 2] }));
  t.equal(i.code, 'glm_trials_invalid', 'whole trials only');
  for (const family of ['gamma', 'inverseGaussian'] as const) {
    i = only(quickFit({ columns: x, terms: ['x'], family, y: [1, 0, 2, 1] }));
    t.equal(i.code, 'glm_response_outside_support', family);
    t.match(i.message, /greater than 0/);
  }
  // Rows are named by their position in the data when the caller passes it.
  const out = fitGlm({ family: 'poisson', design: design(x, ['x']), response: Float64Array.from([1, 2, 0.5, 1]), rows: [3, 7, 9, 12] });
  t.match('issues' in out ? out.issues[0].message : '', /at row 9/);
});

t.test('weights, offset and rows', async (t) => {
  const x = { x: [1, 2, 3, 4] };
  t.equal(only(quickFit({ columns: x, terms: ['x'], family: 'poisson', y: [1, 2, 3, 4], weights: [1, 2, 1, 1] })).code, 'glm_weights_not_supported');
  const i = only(quickFit({ columns: x, terms: ['x'], family: 'poisson', y: [1, 2, 3, 4], offset: [0, Number.NaN, 0, 0] }));
  t.equal(i.code, 'value_not_finite');
  t.same(i.path, ['candidates', 0, 'offset']);
  t.equal(only(quickFit({ columns: { x: [1, 2] }, terms: ['x', { kind: 'power', of: 'x', degree: 2 }], family: 'poisson', y: [1, 2] })).code, 'too_few_rows');
});

t.test('fits that cannot be made', async (t) => {
  const x = { x: [1, 2, 3, 4, 5, 6, 7, 8] };
  // No overdispersion: θ runs to infinity; the Poisson is the limit.
  let i = only(quickFit({ columns: x, terms: ['x'], family: 'negativeBinomial', y: [2, 3, 2, 3, 2, 3, 2, 3] }));
  t.equal(i.code, 'glm_theta_unbounded');
  t.match(i.message, /fit family poisson instead/);
  // An identity-link Poisson whose maximum lies on μ = 0.
  i = only(quickFit({ columns: { x: [0, 1, 2, 3, 4, 5, 6, 7] }, terms: ['x'], family: 'poisson', link: 'identity', y: [0, 0, 0, 5, 4, 7, 6, 9] }));
  t.ok(i.code === 'glm_step_outside_domain' || i.code === 'glm_not_converged', i.code);
  // A gamma model that reproduces its response: the shape's likelihood has no maximum.
  i = only(quickFit({ columns: { x: [1, 2, 3, 4] }, terms: ['x'], family: 'gamma', link: 'identity', y: [2, 3, 4, 5] }));
  t.equal(i.code, 'glm_dispersion_degenerate');
  // The iteration cap is honoured and reported.
  const capped = fitGlm({
    family: 'binomial', link: 'probit', design: design(x, ['x']), response: Float64Array.from([0, 1, 0, 0, 1, 0, 1, 1]), maxIterations: 2,
  });
  t.equal('issues' in capped ? capped.issues[0].code : null, 'glm_not_converged');
  t.match('issues' in capped ? capped.issues[0].message : '', /did not converge in 2 iterations/);
});
