// What a search counts, against an independent comparison (compareModels:
// QR on the rows, itself checked against NIST StRD) of the subsets that are
// distinct models, with Akaike weights by their definition
// (exp(-Δ/2) / Σ exp(-Δ_j/2), common practice):
//   - an exact fit has an unbounded likelihood: no criterion, no weight;
//   - subsets spanning the same column space are one model, counted once;
//   - the best models a search reports are the models it scored (k and criteria
//     equal a comparison of the same terms), or the request is refused;
//   - hierarchy applies to the always terms too.
// Data: the demo scenario's generator (scripts/demo-data.ts), with columns
// derived from it where a case needs an exact relation.
import t from 'tap';
import { demoColumns } from '../../../scripts/demo-data.ts';
import { compareModels } from '../../../src/core/compare.ts';
import { akaikeWeights } from '../../../src/core/scoring/ranking.ts';
import { DEFAULT_POLICY } from '../../../src/core/scoring/policy.ts';
import { prepareSearch, type SearchRequestInput } from '../../../src/core/search/request-problem.ts';
import { searchRankBy, searchReport, type SearchReport } from '../../../src/core/search/report.ts';
import { searchSubsets, type SearchOutcome } from '../../../src/core/search/index.ts';
import type { Issue } from '../../../src/core/issues.ts';
import type { Columns, Term } from '../../../src/core/types.ts';

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(b));

/** The demo rows with no missing value, as plain numeric columns plus kiln. */
function demoRows(): Record<string, (number | string)[]> {
  const d = demoColumns();
  const keep = d.shrinkage.map((y, i) => y !== null && d.moisture[i] !== null);
  const pick = <T>(v: (T | null)[]) => v.filter((_, i) => keep[i]) as T[];
  return { shrinkage: pick(d.shrinkage), peakTemp: pick(d.peakTemp), holdMinutes: pick(d.holdMinutes), moisture: pick(d.moisture), kiln: pick(d.kiln) };
}

type Searched = { issues: Issue[] } | { outcome: SearchOutcome; report: SearchReport };

function search(columns: Columns, pool: Term[], extra: Partial<SearchRequestInput> = {}): Searched {
  const input: SearchRequestInput = { columns, summary: null, response: 'y', weights: null, pool, always: [], hierarchy: false, intercept: true, top: 64, ...extra };
  const prepared = prepareSearch(input);
  if ('issues' in prepared) return { issues: prepared.issues };
  const outcome = searchSubsets(prepared.problem, { criterion: 'aicc', top: input.top, rankDeficient: 'skip' }, 'exhaustive');
  const report = searchReport(prepared, outcome, searchRankBy('aicc', DEFAULT_POLICY, null), { policy: DEFAULT_POLICY, hash: 'h' });
  return { outcome, report };
}

/** A comparison of the given subsets (lists of terms): AICc, k and Akaike weights over exactly these. */
function comparison(columns: Columns, subsets: Term[][]) {
  const candidates = subsets.map((terms, i) => ({ form: 'fit' as const, name: `s${i}`, terms, intercept: true }));
  const out = compareModels({ columns, response: 'y', weights: null, candidates, policy: DEFAULT_POLICY, policyHash: 'h' });
  if ('issues' in out) throw new Error(JSON.stringify(out.issues));
  const models = out.result.models;
  const weights = akaikeWeights(models.map((m) => m.aicc as number));
  return models.map((m, i) => ({ terms: subsets[i], aicc: m.aicc, parameters: m.parameters, weight: weights[i] }));
}

const key = (terms: Term[]) => JSON.stringify(terms);

t.test('exact fits carry no criterion and no weight; the rest are weighted among themselves', (t) => {
  const r = demoRows();
  // A response computed from peakTemp and holdMinutes (a definition, not a measurement): every subset holding both fits exactly.
  const y = (r.peakTemp as number[]).map((x, i) => 0.013 * x - 0.7 + 0.021 * (r.holdMinutes[i] as number));
  const columns = { y, peakTemp: r.peakTemp, holdMinutes: r.holdMinutes, moisture: r.moisture } as Columns;
  const pool: Term[] = ['peakTemp', 'holdMinutes', 'moisture'];
  const out = search(columns, pool);
  if (!('report' in out)) return t.fail(JSON.stringify(out.issues));
  const { report, outcome } = out;
  t.equal(report.exactFits, 2, 'peakTemp + holdMinutes, with and without moisture');
  t.ok(report.models.every((m) => m.aicc !== null && m.logLikelihood !== null), 'no listed model has a null criterion');
  t.notOk(report.models.some((m) => m.terms.includes('peakTemp') && m.terms.includes('holdMinutes')), 'the exact fits are not listed');
  const caution = report.cautions.find((c) => c.code === 'exact_fit_subsets');
  t.ok(caution && caution.message.includes('"peakTemp + holdMinutes"'), 'a caution names them');
  // Reference: the six subsets that are not exact fits, compared and weighted among themselves.
  const rest = [[], ['peakTemp'], ['holdMinutes'], ['moisture'], ['peakTemp', 'moisture'], ['holdMinutes', 'moisture']] as Term[][];
  const reference = new Map(comparison(columns, rest).map((m) => [key(m.terms), m]));
  t.equal(outcome.evaluated, 6);
  t.equal(report.models.length, 6);
  for (const m of report.models) {
    const ref = reference.get(key(m.terms));
    t.ok(ref, `${m.name} is one of the non-exact subsets`);
    if (!ref) continue;
    t.equal(m.aicc, ref.aicc, `${m.name}: AICc of the comparison`);
    t.ok(close(m.weight, ref.weight), `${m.name}: weight ${m.weight} vs ${ref.weight}`);
  }
  t.ok(close(report.models.reduce((s, m) => s + m.weight, 0), 1), 'weights over the counted subsets sum to 1');
  t.end();
});

t.test('subsets spanning the same column space count once', (t) => {
  const r = demoRows();
  // total = peakTemp + moisture exactly (a column and its parts), so {peakTemp, moisture}, {peakTemp, total}, {moisture, total} are one model.
  const total = (r.peakTemp as number[]).map((x, i) => x + (r.moisture[i] as number));
  const columns = { y: r.shrinkage, peakTemp: r.peakTemp, moisture: r.moisture, total } as Columns;
  const out = search(columns, ['peakTemp', 'moisture', 'total']);
  if (!('report' in out)) return t.fail(JSON.stringify(out.issues));
  const { report, outcome } = out;
  t.equal(outcome.rankDeficient, 1, '{peakTemp, moisture, total} has an aliased column');
  t.equal(outcome.sameColumnSpace, 2, '{peakTemp, total} and {moisture, total} repeat {peakTemp, moisture}');
  t.equal(outcome.evaluated, 5);
  t.ok(report.cautions.some((c) => c.code === 'same_column_space_subsets') && report.cautions.some((c) => c.code === 'rank_deficient_subsets'), 'both said');
  const distinct = [[], ['peakTemp'], ['moisture'], ['total'], ['peakTemp', 'moisture']] as Term[][];
  const reference = comparison(columns, distinct);
  t.same(report.models.map((m) => key(m.terms)).sort(), reference.map((m) => key(m.terms)).sort(), 'each distinct model once, the first in pool order standing for its space');
  for (const m of report.models) {
    const ref = reference.find((x) => key(x.terms) === key(m.terms))!;
    t.ok(close(m.weight, ref.weight), `${m.name}: weight ${m.weight} vs ${ref.weight}`);
  }
  const imp = report.importance.map((x) => x.weight);
  const refImp = ['peakTemp', 'moisture', 'total'].map((term) => reference.filter((m) => m.terms.includes(term)).reduce((s, m) => s + m.weight, 0));
  t.ok(imp.every((w, j) => close(w, refImp[j])), `importance ${imp} vs ${refImp}`);
  // The same through the Gray-code walk and branch and bound, whose swept states differ.
  const prepared = prepareSearch({ columns, summary: null, response: 'y', weights: null, pool: ['peakTemp', 'moisture', 'total'], always: [], hierarchy: false, intercept: true, top: 3 });
  if ('issues' in prepared) return t.end();
  const bb = searchSubsets(prepared.problem, { criterion: 'aicc', top: 3, rankDeficient: 'skip' }, 'branchAndBound');
  t.same(bb.models.map((m) => m.terms), outcome.models.slice(0, 3).map((m) => m.terms), 'branch and bound keeps the same best three');
  t.end();
});

t.test('a reported model is the model the search scored: k and criteria of a comparison of its terms', (t) => {
  const r = demoRows();
  const columns = { y: r.shrinkage, peakTemp: r.peakTemp, moisture: r.moisture, kiln: r.kiln } as Columns;
  // kiln is categorical: factor(kiln) and the product code it alike in every subset, so the pool is accepted.
  const pool: Term[] = ['peakTemp', 'moisture', { kind: 'factor', of: 'kiln' }, { kind: 'product', of: ['peakTemp', 'kiln'] }, { kind: 'power', of: 'peakTemp', degree: 2 }];
  const out = search(columns, pool, { top: 10 });
  if (!('report' in out)) return t.fail(JSON.stringify(out.issues));
  const reference = comparison(columns, out.report.models.map((m) => m.terms));
  out.report.models.forEach((m, i) => {
    t.equal(m.parameters, reference[i].parameters, `${m.name}: k`);
    t.equal(m.aicc, reference[i].aicc, `${m.name}: AICc to the last digit`);
    t.equal(m.parameters, out.outcome.models.find((s) => key(s.terms.map((j) => pool[j])) === key(m.terms))?.parameters, `${m.name}: k as scored`);
  });
  // A factor declaration that recodes another term in some subsets only: refused, naming both.
  const g = (r.peakTemp as number[]).map((_, i) => 1 + (i % 3));
  const numericG = { y: r.shrinkage, a: r.moisture, g } as Columns;
  const refused = search(numericG, [{ kind: 'factor', of: 'g' }, { kind: 'product', of: ['g', 'a'] }]);
  t.ok('issues' in refused);
  if ('issues' in refused) t.same(refused.issues.map((i) => [i.code, i.path.join('/')]), [['search_coding_varies', 'pool/1']]);
  const reference2 = search({ ...columns }, [{ kind: 'factor', of: 'kiln', reference: 'west' }, { kind: 'product', of: ['peakTemp', 'kiln'] }]);
  t.ok('issues' in reference2 && reference2.issues[0].code === 'search_coding_varies', 'a reference level set in the pool recodes the product: refused');
  const moved = search(numericG, [{ kind: 'product', of: ['g', 'a'] }], { always: [{ kind: 'factor', of: 'g' }] });
  t.ok('report' in moved, 'with the declaration in always every subset codes g alike');
  t.end();
});

t.test('hierarchy: an always term\'s needs must be always terms', (t) => {
  const r = demoRows();
  const columns = { y: r.shrinkage, a: r.peakTemp, b: r.moisture } as Columns;
  const always: Term[] = [{ kind: 'power', of: 'a', degree: 2 }];
  const inPool = search(columns, ['a', 'b'], { always, hierarchy: true });
  t.ok('issues' in inPool);
  if ('issues' in inPool) t.same(inPool.issues.map((i) => [i.code, i.path.join('/'), (i as { inPool?: boolean }).inPool]), [['hierarchy_always_incomplete', 'always/0', true]]);
  const nowhere = search(columns, ['b'], { always, hierarchy: true });
  t.ok('issues' in nowhere && (nowhere.issues[0] as { inPool?: boolean }).inPool === false);
  const met = search(columns, ['b'], { always: ['a', ...always], hierarchy: true });
  t.ok('report' in met && met.report.models.every((m) => m.terms.includes('a')), 'met by always: every model holds a');
  t.ok('report' in search(columns, ['a', 'b'], { always, hierarchy: false }), 'without the rule the same request runs');
  t.end();
});
