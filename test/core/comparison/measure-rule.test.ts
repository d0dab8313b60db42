// A comparison never ranks a probability mass beside a density: the rule
// reads only ScoredModel.measure, so it holds for every kind.
import t from 'tap';
import { mixedMeasureIssues } from '../../../src/core/comparison/measure-rule.ts';
import type { LikelihoodMeasure, ScoredModel } from '../../../src/core/models/scored-model.ts';

const model = (name: string, measure: LikelihoodMeasure) => ({ name, measure }) as ScoredModel;
const at = (names: string[]) => (name: string) => names.indexOf(name);

t.test('one measure: nothing to refuse', async (t) => {
  t.same(mixedMeasureIssues([model('a', 'density'), model('b', 'density')], at(['a', 'b'])), []);
  t.same(mixedMeasureIssues([model('a', 'mass'), model('b', 'mass')], at(['a', 'b'])), []);
});

t.test('a mass beside a density is refused, naming both', async (t) => {
  const names = ['weibull', 'poisson', 'negbin'];
  const [found] = mixedMeasureIssues([model('weibull', 'density'), model('poisson', 'mass'), model('negbin', 'mass')], at(names));
  t.equal(found.code, 'likelihood_measures_mixed');
  t.same(found.path, ['candidates', 1], 'at the first mass candidate');
  t.match(found.message, /"poisson".*probability mass.*"weibull".*density/);
  t.match(found.message, /"poisson", "negbin"/);
});
