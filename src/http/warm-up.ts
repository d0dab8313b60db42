// Warming the code before the first caller comes. V8 compiles a function the
// first time it runs and optimises it after a few runs, so the first
// comparison a fresh process answers took 65–140 ms against ~30 ms once warm,
// and the first search on a fresh worker 90–590 ms against ~30–60 ms (a
// loaded 2-core machine, `npm start`). The service therefore runs the demo
// scenario's worked examples once before it says it is ready: each compute
// worker a comparison and a whole search (prepare, score, report) before it
// tells the pool it is ready, the main thread a comparison, its request check
// and the record's canonical text before it listens. Nothing is recorded and
// nothing is answered: the results are thrown away.
import { canonicalJson, sha256Hex } from '../audit/chain.ts';
import { DEFAULT_SEARCH_BUDGET } from '../core/search/index.ts';
import { DEFAULT_ACTIVE_POLICY } from '../policy-file.ts';
import { computeSearch, type SearchSession } from './compute/search-run.ts';
import { runJob, type Job } from './jobs/index.ts';
import { fromMain } from './jobs/transport.ts';
import { comparisonExample, searchExample } from './openapi-examples.ts';
import { ComparisonRequest } from './schemas/comparison-request.ts';
import { SearchRequest } from './schemas/search-request.ts';

const RESULT_CAP = { limit: 16 * 2 ** 20, setting: 'MAX_RESULT_BYTES' } as const;

// An example that does not compute is a fault of this build: said, not passed over.
function refused(what: string, outcome: object): Error {
  return new Error(`the ${what} example did not compute: ${JSON.stringify(outcome).slice(0, 300)}`);
}

function comparisonOnce(): void {
  const body = ComparisonRequest.parse(comparisonExample);
  const done = runJob({ kind: 'comparison', body, policy: DEFAULT_ACTIVE_POLICY, resultCap: RESULT_CAP, schemaCheck: false });
  if (!('resultJson' in done)) throw refused('comparison', done);
  sha256Hex(canonicalJson(body) + done.resultJson);
}

/** On the main thread, before the service listens. */
export function warmUpMainThread(): void {
  comparisonOnce();
}

/** On a compute worker, before it says it is ready: the jobs run here, one after another. */
export async function warmUpWorker(): Promise<void> {
  comparisonOnce();
  const here: SearchSession = {
    run: async <T>(job: unknown) => runJob(fromMain(job) as Job) as T,
    runOn: async <T>(job: unknown) => ({ value: runJob(fromMain(job) as Job) as T, worker: 0 }),
  };
  const done = await computeSearch(here, {
    body: SearchRequest.parse(searchExample),
    policy: DEFAULT_ACTIVE_POLICY,
    budget: DEFAULT_SEARCH_BUDGET,
    compute: { caps: { resultBytes: RESULT_CAP }, schemaCheck: false, pool: { size: 1 } },
  });
  if (!('answer' in done)) throw refused('search', done);
}
