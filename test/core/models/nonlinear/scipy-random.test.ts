// Seeded random problems with known true parameters (exponential decay,
// saturation, logistic growth, a Gaussian peak, a power law, a rational
// curve, an oscillation, an Arrhenius line; weighted, multi-start and bounded
// cases) against scipy.optimize.least_squares with analytic Jacobians and
// tolerances at rounding level (test/reference/nonlinear/scipy-random.json,
// made by scripts/nonlinear-scipy-fixtures.py; versions in the file).
import t from 'tap';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { fitPlain, fitted } from './fit-helper.ts';
import { predictNonlinear } from '../../../../src/core/models/nonlinear/index.ts';

interface ScipyProblem {
  name: string;
  expression: string;
  parameters: string[];
  truth: number[];
  starts: number[][];
  columns: Record<string, number[]>;
  response: number[];
  weights: number[] | null;
  bounds: Record<string, [number | null, number | null]> | null;
  scipy: {
    estimates: number[];
    standardErrors: number[];
    rss: number;
    activeMask: number[];
    predictions: { at: number[]; estimate: number[]; standardError: number[] };
  };
}

const fixture = JSON.parse(readFileSync(fileURLToPath(new URL('../../../reference/nonlinear/scipy-random.json', import.meta.url)), 'utf8'));
const problems = fixture.problems as ScipyProblem[];
const versions = `scipy ${fixture.versions.scipy}, numpy ${fixture.versions.numpy}`;

const vector = (names: string[], values: number[]) => Object.fromEntries(names.map((n, j) => [n, values[j]]));

for (const problem of problems) {
  t.test(`${problem.name} against ${versions}`, async (t) => {
    const starts = problem.starts.map((s) => vector(problem.parameters, s));
    const { fit, candidate } = fitted(fitPlain({
      spec: {
        name: problem.name, expression: problem.expression,
        ...(starts.length === 1 ? { start: starts[0] } : { starts }),
        ...(problem.bounds ? { bounds: problem.bounds } : {}),
      },
      columns: problem.columns, y: problem.response, weights: problem.weights,
    }));
    const ref = problem.scipy;
    const rssError = Math.abs(fit.rss - ref.rss) / ref.rss;
    t.ok(rssError <= 1e-10, `RSS agrees to ${rssError.toExponential(1)}`);
    fit.coefficients.forEach((c, j) => {
      const se = ref.standardErrors[j];
      // In units of the standard error: two solvers at one minimum differ by rounding only.
      t.ok(Math.abs(c.estimate - ref.estimates[j]) <= 1e-6 * se, `${c.term} estimate within 1e-6 SE of scipy's`);
      t.ok(Math.abs((c.standardError ?? NaN) - se) <= 1e-7 * se, `${c.term} standard error agrees to 1e-7`);
      // The data were drawn around known values: the estimate lies within a
      // few SE of the truth (except where a bound deliberately holds it away).
      if (!problem.bounds) t.ok(Math.abs(c.estimate - problem.truth[j]) <= 6 * se, `${c.term} within 6 SE of the true value`);
    });
    const held = problem.parameters.filter((_, j) => ref.activeMask[j] !== 0);
    t.same(fit.atBounds, held, 'the same parameters end on a bound');
    t.equal(fit.convergence.starts.length, problem.starts.length);
    t.ok(fit.convergence.starts.some((s) => s.status === 'converged' && s.start === fit.convergence.start));

    const column = Object.keys(problem.columns)[0];
    const { predictions, issues } = predictNonlinear(fit, candidate, [Float64Array.from(ref.predictions.at)], ref.predictions.at.length);
    t.same(issues, []);
    predictions.forEach((p, i) => {
      const se = ref.predictions.standardError[i];
      t.ok(Math.abs((p.estimate ?? NaN) - ref.predictions.estimate[i]) <= 1e-6 * se, `prediction at ${column} = ${ref.predictions.at[i].toFixed(3)}`);
      t.ok(Math.abs((p.standardError ?? NaN) - se) <= 1e-6 * se, 'delta-method standard error agrees to 1e-6');
    });
  });
}
