// Type-level checks, compiled (not run) by `npm test`: the generated types accept the
// request forms of the contract and refuse wrong ones. A line under @ts-expect-error that
// stops being an error fails the compile.
import { createClient, type ComparisonRequest, type ComparisonResult, type SearchEvent } from '../dist/index.js';

const client = createClient({ baseUrl: 'http://127.0.0.1:8080' });

export const good: ComparisonRequest = {
  data: { columns: { y: [1, 2, null], x: [1, 2, 3], kiln: ['east', 'west', 'east'] } },
  response: 'y',
  candidates: [
    { name: 'line', terms: ['x', { kind: 'power', of: 'x', degree: 2 }] },
    { name: 'elsewhere', rss: 1.5, parameters: 3, observations: 3 },
    { name: 'likelihood', logLikelihood: -4.2, parameters: 2, observations: 3 },
  ],
};

export async function usage(): Promise<number> {
  const result: ComparisonResult = await client.compare(good);
  const best: string = result.rankings.aicc[0].name;
  for await (const event of client.searchStream({ data: good.data!, response: 'y', pool: ['x'] })) {
    const e: SearchEvent = event;
    if (e.event === 'progress') return e.data.covered;
    return e.data.evaluated;
  }
  // @ts-expect-error a term kind the contract does not have
  await client.compare({ ...good, candidates: [{ name: 'bad', terms: [{ kind: 'spline', of: 'x' }] }] });
  // @ts-expect-error rankBy names a criterion
  await client.compare({ ...good, options: { rankBy: 'smallest' } });
  // @ts-expect-error a number column holds numbers or null, not booleans
  await client.compare({ ...good, data: { columns: { y: [true] } } });
  // @ts-expect-error chart sizes are named
  await client.chartSvg('id', { size: 'huge' });
  return best.length;
}
