// A generalised-linear search request made ready to fit: the same preparation
// as a least-squares search (rows, hierarchy, the check that every term is
// coded alike in every subset, the fingerprint), then the family's own checks
// once for all subsets — the link the family admits, the offset and trials
// columns, the response inside the family's support — with the same issues
// and words a comparison candidate gets, and the design over every term.
import { buildDesign } from '../../design/index.ts';
import { unknownColumn } from '../../design/columns.ts';
import { issue, type Issue } from '../../issues.ts';
import { FAMILIES, resolveLink } from '../../models/glm/index.ts';
import { numericColumn } from '../../models/glm/kind.ts';
import { checkGlmData, type GlmFieldPaths } from '../../models/glm/support.ts';
import { prepareSearch, type PreparedSearch, type SearchRequestInput } from '../request-problem.ts';
import type { GlmSearchData, GlmSearchSpec } from './types.ts';

/** Where a search's GLM fields sit in the request: all at its top level. */
export const SEARCH_GLM_PATHS: GlmFieldPaths = { candidate: [], response: ['response'], trials: ['trials'], offset: ['offset'], weights: ['weights'] };

export interface PreparedGlmSearch {
  prepared: PreparedSearch;
  spec: GlmSearchSpec;
  data: GlmSearchData;
}

export function prepareGlmSearch(input: SearchRequestInput & { glm: GlmSearchSpec }): PreparedGlmSearch | { issues: Issue[] } {
  const spec = input.glm;
  const link = resolveLink(spec.family, spec.link);
  if (!link) {
    return { issues: [issue('glm_link_not_allowed', ['link'], { family: spec.family, link: String(spec.link), allowed: [...FAMILIES[spec.family].links] })] };
  }
  if (input.columns) {
    // Named before the rows are sampled on them, as a comparison names a candidate's unknown offset.
    const unknown = (['offset', 'trials'] as const).flatMap((field) => {
      const name = field === 'trials' && spec.family !== 'binomial' ? undefined : spec[field];
      return name !== undefined && !Object.prototype.hasOwnProperty.call(input.columns, name) ? [unknownColumn([field], name, input.columns!)] : [];
    });
    if (unknown.length > 0) return { issues: unknown };
  }
  const prepared = prepareSearch(input);
  if ('issues' in prepared) return prepared;
  const source = prepared.source;
  // prepareSearch refuses a summary for a GLM search, so the source holds rows.
  if (source.kind !== 'rows') throw new Error('a generalised linear search needs rows');
  const { columns, rows } = source;
  const issues: Issue[] = [];
  const read = (name: string | undefined, at: 'offset' | 'trials'): Float64Array | null => {
    if (name === undefined) return null;
    const values = numericColumn(columns, name, rows, [at]);
    if (values instanceof Float64Array) return values;
    issues.push(values);
    return null;
  };
  const offset = read(spec.offset, 'offset');
  const trials = spec.family === 'binomial' ? read(spec.trials, 'trials') : null;
  if (issues.length > 0) return { issues };
  const weights = source.weights?.values ?? null;
  const checked = checkGlmData(spec.family, { response: source.y, trials, offset, weights, rows }, SEARCH_GLM_PATHS);
  if ('issues' in checked) return checked;
  const built = buildDesign(columns, [...input.pool, ...input.always], input.intercept, rows);
  // The same design prepareSearch built without complaint.
  if ('issues' in built) throw new Error(`search design: ${built.issues[0].message}`);
  return {
    prepared,
    spec,
    data: { family: spec.family, link, design: built.design, poolSize: input.pool.length, y: source.y, trials, offset, weights, rows, columns },
  };
}
