// POST /v1/searches request: data (rows or a summary), the response, the pool
// of terms every subset of which is a candidate, and how to rank them.
import { z } from 'zod';
import { ColumnName, Term } from './common.ts';
import { DataSchema, ResponseTransform, WeightsColumn } from './comparison-request.ts';
import { SummaryData } from './summary.ts';
import { GlmFamily, GlmLink, TrialsColumn } from './glm.ts';

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
    family: GlmFamily.optional().meta({
      description: 'Every subset a generalised linear model of this family, fitted by IRLS (absent, or gaussian with the identity link and no offset: least squares over cross products, as before). Needs data.columns. A pool small enough to fit every subset within the price is searched exhaustively (proven); a larger one by stepwise selection with swaps (proven false). Each subset starts IRLS from the coefficients of the subset it was reached from; the listed models are refitted as a comparison fits them. A subset that separates or does not converge is skipped and counted (glm.fitFailures), the search goes on.',
    }),
    link: GlmLink.optional(),
    offset: ColumnName.optional().meta({ description: 'A numeric column added to every subset\'s linear predictor as it is (for example the log of an exposure); rows where it is missing are left out of every subset.' }),
    trials: TrialsColumn,
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
    // The same words as a comparison candidate's (comparison-request.ts): a GLM relates the response through its link.
    if (r.responseTransform && ((r.family ?? 'gaussian') !== 'gaussian' || r.link !== undefined || r.offset !== undefined)) {
      ctx.addIssue({ code: 'custom', path: ['responseTransform'], message: 'a response transform applies to least-squares searches only; a generalised linear model relates the response to its terms through its link' });
    }
  })
  .meta({ id: 'SearchRequest' });

export type SearchRequest = z.output<typeof SearchRequest>;
