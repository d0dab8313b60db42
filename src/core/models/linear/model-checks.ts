// Per fitted model: the exact leave-one-out error (PRESS from the hat matrix,
// no refits) and the assumption checks behind every criterion, with row
// numbers mapped back to the caller's data rows. Both read one geometry of
// the model (its R factor and leverages), factorised once.
import { leaveOneOutError } from '../../loo.ts';
import { modelGeometry, type ModelGeometry } from '../../inference/model-geometry.ts';
import { diagnoseFit, type ModelDiagnostics } from '../../diagnostics/index.ts';
import type { FittedModel } from './fitted-model.ts';
import type { ModelChecks } from '../scored-model.ts';

export function modelChecks(
  model: FittedModel,
  rows: readonly number[],
  weights: Float64Array | undefined,
  geometry: ModelGeometry = modelGeometry(model.fit, model.design, weights),
): ModelChecks {
  const loo = leaveOneOutError(model.fit, model.design, weights, geometry);
  const { cautions, ...d } = diagnoseFit(model.fit, model.design, weights, geometry);
  const dataRow = (i: number | null) => (i === null ? null : rows[i]);
  const diagnostics: ModelDiagnostics = {
    ...d,
    influence: {
      ...d.influence,
      maxCooksDistanceRow: dataRow(d.influence.maxCooksDistanceRow),
      highLeverageRowIndices: d.influence.highLeverageRowIndices.map((i) => rows[i]),
    },
  };
  return {
    press: loo.press,
    looRmse: loo.looRmse,
    looNote: loo.reason,
    diagnostics,
    // Each finding once, among the model's cautions (the diagnostics hold the numbers).
    cautions: cautions.map((message) => ({ code: 'assumption_check', message })),
  };
}
