// POST /v1/searches response: the best subsets with the fields of a
// comparison's models plus their terms, delta and weight over every
// evaluated subset; term importance; the budget the search ran under.
import { z } from 'zod';
import { Term } from './common.ts';
import { ResponseTransform } from './comparison-request.ts';
import { Caution, Conventions, Dataset, ModelResult } from './comparison-response.ts';
import { GlmFamily, GlmLink } from './glm.ts';

export const SearchModel = ModelResult.extend({
  terms: z.array(Term).meta({ description: 'The subset\'s terms in the request\'s forms: its pool terms in pool order, then the always terms. Sent as a comparison candidate they give these numbers to the last digit.' }),
  delta: z.number().meta({ description: 'Criterion value minus the best over all evaluated subsets (>= 0).' }),
  weight: z.number().meta({ description: 'Akaike weight over all evaluated subsets: exp(−Δ/2) / Σ exp(−Δ_j/2).' }),
}).meta({ id: 'SearchModel' });

export const SearchBudgetSchema = z
  .strictObject({
    maxSubsets: z.number().int().meta({ description: 'Most subsets one exhaustive search may score (2^m for m pool terms).' }),
    maxBranchAndBoundTerms: z.number().int().meta({ description: 'Largest pool branch and bound accepts.' }),
    maxNodes: z.number().int().meta({ description: 'Most tree nodes branch and bound may visit.' }),
    estimatedFlops: z.number().nullable().meta({ description: 'Exhaustive: about 2 d² multiply-adds per subset (d design columns); null for branch and bound.' }),
    nodes: z.number().int().meta({ description: 'Branch-and-bound tree nodes visited, on every thread (0 exhaustive).' }),
    elapsedMs: z.number().meta({ description: 'Wall time of the subset scoring (not the refits).' }),
  })
  .meta({ id: 'SearchBudget' });

export const GlmSearchFacts = z
  .strictObject({
    family: GlmFamily,
    link: GlmLink,
    offset: z.string().nullable(),
    trials: z.string().nullable(),
    searchRule: z.string().meta({ description: 'How the subsets were searched: every subset, or stepwise selection with swaps (and why not branch and bound).' }),
    warmStart: z.string().meta({ description: 'How each subset\'s IRLS was started, and why the start does not change the converged answer beyond the convergence rule\'s tolerance.' }),
    fitFailures: z.strictObject({
      separation: z.number().int().meta({ description: 'Subsets whose coefficients run to infinity (separation): no maximum-likelihood estimate.' }),
      notConverged: z.number().int().meta({ description: 'Subsets whose IRLS (or θ) did not settle within its caps, or left the family\'s domain.' }),
      other: z.number().int().meta({ description: 'Subsets with too few rows for their columns, or a dispersion of 0.' }),
    }).meta({ description: 'Subsets skipped because their fit failed; the search went on without them and they take no part in weights.' }),
    solves: z.number().int().meta({ description: 'Weighted least-squares solves over every subset fit.' }),
    warmStarts: z.number().int().meta({ description: 'Fits started from the coefficients of the subset they were reached from.' }),
  })
  .meta({ id: 'GlmSearchFacts', description: 'Present for a generalised-linear search (family other than gaussian, a link other than identity, or an offset).' });

export const SearchResult = z
  .strictObject({
    id: z.string(),
    createdAt: z.string(),
    serviceVersion: z.string(),
    conventions: Conventions,
    policy: z.strictObject({ name: z.string(), hash: z.string() }),
    dataset: Dataset,
    responseTransform: ResponseTransform.extend({ jacobian: z.number().meta({ description: 'Σ ln g\'(y) over the rows, added to every subset\'s log-likelihood.' }) })
      .nullable()
      .meta({ description: 'The transform of the response every subset describes (the request\'s responseTransform), with its log-Jacobian; null when the subsets describe the response itself.' }),
    method: z.enum(['exhaustive', 'branchAndBound', 'stepwiseSwaps']).meta({
      description: 'exhaustive: every subset scored. branchAndBound: least squares beyond the exhaustive budget (`proven` says whether the best are proven). stepwiseSwaps: a generalised-linear search too large to fit every subset, by stepwise selection with swaps (a local optimum: `proven` is false).',
    }),
    evaluated: z.number().int().meta({ description: 'Subsets scored; delta, weights and importance are over exactly these (each distinct model once, exact fits excluded).' }),
    subsets: z.number().int().meta({ description: '2^m: every subset of the pool.' }),
    weightsCoverAllSubsets: z.boolean().meta({ description: 'True when no admissible subset was pruned, so weights and importance are over all of them.' }),
    proven: z.boolean().meta({
      description:
        'True when `models` are proven the best `top`: every subset was scored, or proven by branch and bound unable to enter. False when the node budget (budget.maxNodes) ran out first: `models` are then the best found so far, at least as good as stepwise selection with swaps finds, and a caution says so.',
    }),
    passedOver: z
      .strictObject({
        notHierarchical: z.number().int(),
        unscorable: z.number().int(),
        pruned: z.number().int(),
        rankDeficient: z.number().int().meta({ description: 'Subsets with an aliased design column (conventions.rank): each repeats the column space of a smaller subset.' }),
        sameColumnSpace: z.number().int().meta({ description: 'Full-rank subsets spanning exactly the column space of another subset that is counted instead (the one whose terms come first in pool order).' }),
        exactFit: z.number().int().meta({ description: 'Subsets reproducing the response exactly (residuals at rounding level): unbounded likelihood, no criterion value; named in a caution.' }),
        fitFailed: z.number().int().optional().meta({ description: 'Generalised-linear searches: subsets whose IRLS fit has no maximum-likelihood answer (separation, no convergence), skipped; glm.fitFailures splits them.' }),
      })
      .meta({
        description:
          'Subsets not scored: outside the hierarchy rule, without a criterion value, proven out of the top by branch and bound, repeats of a model already counted (aliased columns or the same column space), or exact fits.',
      }),
    rankDeficient: z.number().int().meta({ description: 'Subsets with aliased design columns, all passed over (the same count as passedOver.rankDeficient).' }),
    budget: SearchBudgetSchema,
    threads: z.number().int().meta({ description: 'Worker threads the subsets were scored on.' }),
    models: z.array(SearchModel).meta({ description: 'The best `top` subsets by conventions.rankBy, best first.' }),
    importance: z
      .array(z.strictObject({ term: Term, label: z.string(), weight: z.number() }))
      .meta({ description: 'Per pool term, in pool order: the summed weight of the evaluated subsets that hold it.' }),
    glm: GlmSearchFacts.optional(),
    cautions: z.array(Caution),
  })
  .meta({ id: 'SearchResult' });

export type SearchResult = z.output<typeof SearchResult>;
