// POST /v1/searches request: data (rows or a summary), the response, the pool
// of terms every subset of which is a candidate, and how to rank them.
import { z } from 'zod';
import { ColumnName, Term } from './common.ts';
import { DataSchema, ResponseTransform, WeightsColumn } from './comparison-request.ts';
import { SummaryData } from './summary.ts';

export const MAX_POOL_TERMS = 60;

export const SearchCriterionSchema = z
  .enum(['aicc', 'aic', 'bic', 'hqc'], {
    error: (issue) =>
      issue.input === 'adjustedR2'
        ? 'a search ranks by aicc, aic, bic or hqc; adjustedR2 has no Akaike weights over subsets (compare a few models with POST /v1/comparisons to see it)'
        : 'rankBy is one of aicc, aic, bic, hqc',
  })
  .meta({ id: 'SearchCriterion' });

export const SearchRequest = z
  .strictObject({
    data: z.union([DataSchema, SummaryData]).meta({ description: 'The rows (data.columns) or a data summary (data.summary); with a summary every term is a summarised column name.' }),
    response: ColumnName,
    weights: WeightsColumn.meta({ description: 'A weights column of data.columns (0 leaves a row out); a weighted summary carries its weights itself.' }),
    pool: z.array(Term).min(1, 'the pool needs at least one term').max(MAX_POOL_TERMS).meta({ description: 'Every subset of the pool (with the always terms) is a candidate.' }),
    always: z.array(Term).max(200).default([]).meta({ description: 'Terms in every candidate.' }),
    hierarchy: z.boolean().default(false).meta({ description: 'Admit a power or product only with every lower-order term it is built from (x^3 needs x and x^2; a×b needs a and b).' }),
    intercept: z.boolean().default(true),
    responseTransform: ResponseTransform.optional().meta({
      description: 'Every subset describes g(response) instead of the response: fitted to the transformed values, scored with the Jacobian so AIC, AICc, BIC and HQC stay on the scale of the response (comparable with a search or comparison of the response itself). Needs data.columns: the Jacobian sums over the rows.',
    }),
    rankBy: SearchCriterionSchema.optional().meta({ description: 'Default from the team policy (aicc when the policy ranks by adjustedR2).' }),
    top: z.number().int().min(1).max(100).default(20).meta({ description: 'How many of the best subsets to return, refitted.' }),
    exhaustive: z.boolean().default(false).meta({
      description: 'Refuse (422) rather than fall back to branch and bound when scoring every subset is beyond the compute budget; with branch and bound the best models are exact when `proven` is true (the best found so far when the node budget ran out first), and weights cover only the evaluated subsets.',
    }),
    label: z.string().max(1000).optional(),
  })
  .superRefine((r, ctx) => {
    if ('summary' in r.data && r.weights) {
      ctx.addIssue({ code: 'custom', path: ['weights'], message: 'with data.summary the weights are inside the summary (summary.weights: { sum, sumLog }); leave weights out' });
    }
  })
  .meta({ id: 'SearchRequest' });

export type SearchRequest = z.output<typeof SearchRequest>;
