// Cautions that concern the whole comparison rather than one model.
export interface Caution {
  code: string;
  message: string;
}

/** Carried by every comparison: a ranking is not a validation. */
export const STANDING_CAUTION: Caution = {
  code: 'ranking_is_not_validation',
  message:
    'Criteria rank the candidate models against each other; they do not validate any of them. Before a model is used for a safety-relevant decision, defer to domain review and to local rules.',
};

export function rowsDroppedCaution(dropped: number, total: number): Caution | null {
  if (dropped === 0) return null;
  return {
    code: 'rows_dropped',
    message: `${dropped} of ${total} rows have a missing value in a column some candidate uses and were left out of every candidate, so all models are compared on the same ${total - dropped} rows.`,
  };
}
