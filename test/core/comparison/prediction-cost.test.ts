import t from 'tap';
import { predictionCost, TAIL_AREA_STEPS, T_CDF_CELLS } from '../../../src/core/comparison/extras/prediction-cost.ts';

t.test('the price of predictions follows the request shape alone', async (t) => {
  t.equal(predictionCost({ rows: 0, columnsPerModel: [3, 4] }), 0);
  t.equal(predictionCost({ rows: 10, columnsPerModel: [] }), 0);
  // One model: no average to bound, p + p² per row.
  t.equal(predictionCost({ rows: 10, columnsPerModel: [3] }), 10 * (3 + 9));
  // Two models: each row also pays four averaged bounds over both models.
  t.equal(predictionCost({ rows: 10, columnsPerModel: [3, 4] }), 10 * (3 + 9 + 4 + 16 + 4 * TAIL_AREA_STEPS * 2 * T_CDF_CELLS));
  // Linear in rows.
  t.equal(predictionCost({ rows: 20, columnsPerModel: [3, 4] }), 2 * predictionCost({ rows: 10, columnsPerModel: [3, 4] }));
});
