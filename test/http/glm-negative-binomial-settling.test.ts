// A negative binomial model with a kiln factor on sparse, overdispersed defect
// counts (invented, tile scenario; θ about 0.44). R 4.2.2 Patched (2022-11-10
// r83330), MASS 7.3.58.2, glm.nb(defects ~ peakTemp + moisture + kiln +
// offset(logTiles), control = glm.control(epsilon = 1e-12, maxit = 100)) fits
// it: log-likelihood -52.0291664802, theta 0.4364679688 (run by hand in a
// review). Fisher scoring under the log link, which is not the negative
// binomial's canonical link, converges only linearly here (about 0.6 per
// step), and the service once refused the fit as not converged; Newton steps
// by the observed information (then Fisher steps for the covariance) fit it.
import t from 'tap';
import { buildTestApp } from '../helper.ts';

const columns = {"defects": [0, 21, 0, 1, 0, 2, 1, 1, 3, 0, 0, 0, 2, 0, 3, 1, 9, 0, 6, 3, 1, 0, 0, 3, 0, 3, 0, 0, 0, 0], "peakTemp": [1173.796463, 1204.422923, 1186.995517, 1210.392004, 1212.57203, 1156.552886, 1151.316799, 1233.746908, 1175.935401, 1173.433096, 1249.564484, 1197.026351, 1233.646145, 1197.635321, 1213.906814, 1165.061642, 1213.486066, 1236.804531, 1202.318121, 1224.125186, 1217.141148, 1156.403144, 1225.823025, 1209.109958, 1180.126766, 1153.101175, 1236.552724, 1197.274909, 1221.882392, 1237.88128], "moisture": [6.856518, 7.684395, 5.579854, 7.203635, 5.778484, 7.742347, 7.515467, 4.389817, 4.543875, 4.867948, 7.861921, 5.744647, 6.506593, 5.204105, 6.028972, 5.543465, 5.403642, 6.340296, 6.337007, 7.616807, 6.727929, 7.715782, 7.425602, 7.963959, 6.685094, 4.652398, 7.44255, 7.858532, 7.618784, 6.27643], "kiln": ["C", "C", "A", "C", "C", "B", "B", "A", "A", "B", "C", "B", "A", "B", "A", "B", "A", "A", "B", "B", "B", "A", "A", "C", "C", "A", "B", "C", "C", "B"], "logTiles": [5.945421, 6.311735, 6.349139, 5.488938, 5.880533, 5.393628, 4.770685, 5.55296, 4.634729, 4.934474, 5.043425, 6.008813, 5.924256, 4.75359, 6.371612, 5.303305, 6.391917, 5.7301, 5.517453, 6.021023, 5.455321, 5.187386, 6.115892, 4.795791, 6.298949, 5.609472, 5.560682, 5.648974, 6.380123, 5.135798]};

t.test('negative binomial with a factor and a small θ: R\'s fit', async (t) => {
  const { app } = await buildTestApp(t);
  const res = await app.inject({
    method: 'POST',
    url: '/v1/comparisons',
    payload: {
      data: { columns },
      response: 'defects',
      candidates: [
        { name: 'temp', terms: ['peakTemp'], family: 'negativeBinomial', offset: 'logTiles' },
        { name: 'all', terms: ['peakTemp', 'moisture', 'kiln'], family: 'negativeBinomial', offset: 'logTiles' },
      ],
    },
  });
  t.equal(res.statusCode, 200, res.body.slice(0, 300));
  const all = res.json().models.find((m: { name: string }) => m.name === 'all');
  t.ok(Math.abs(all.logLikelihood - -52.0291664802) < 1e-6, `log-likelihood ${all.logLikelihood} vs R glm.nb -52.0291664802`);
  const theta = all.distributionParameters.find((p: { name: string }) => p.name === 'theta').estimate;
  t.ok(Math.abs(theta - 0.4364679688) < 1e-6, `theta ${theta} vs R glm.nb 0.4364679688`);
  t.equal(all.convergence.converged, true);
});
