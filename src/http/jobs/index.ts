// Every kind of job the compute pool runs, and the one function a worker (or,
// for a small comparison, the main thread) calls to run one. Each job is a
// pure function of its message.
import type { SearchPartial } from '../../core/search/index.ts';
import type { SearchTask } from '../../search/workers/messages.ts';
import { runTask } from '../../search/workers/run-task.ts';
import { comparisonJob, type ComparisonJob, type ComparisonJobOutcome } from './comparison-job.ts';
import { glmSearchJob, type GlmSearchJob } from './glm-search-job.ts';
import { searchPrepareJob, searchReportJob, type SearchPrepareJob, type SearchReportJob } from './search-jobs.ts';

export type Job = ComparisonJob | SearchPrepareJob | { kind: 'searchTask'; task: SearchTask } | SearchReportJob | GlmSearchJob;

export interface JobResults {
  comparison: ComparisonJobOutcome;
  searchPrepare: ReturnType<typeof searchPrepareJob>;
  searchTask: SearchPartial;
  searchReport: ReturnType<typeof searchReportJob>;
  glmSearch: ReturnType<typeof glmSearchJob>;
}

export function runJob<J extends Job>(job: J): JobResults[J['kind']] {
  switch (job.kind) {
    case 'comparison':
      return comparisonJob(job) as JobResults[J['kind']];
    case 'searchPrepare':
      return searchPrepareJob(job) as JobResults[J['kind']];
    case 'searchTask':
      return runTask(job.task) as JobResults[J['kind']];
    case 'searchReport':
      return searchReportJob(job) as JobResults[J['kind']];
    case 'glmSearch':
      return glmSearchJob(job) as JobResults[J['kind']];
    default:
      throw new Error(`unknown job kind ${(job as { kind: string }).kind}`);
  }
}

/** The module the pool's workers run: this folder's worker, as source (.ts) or built (.js) like this file. */
export const JOB_WORKER_MODULE = new URL(`./worker${import.meta.url.endsWith('.ts') ? '.ts' : '.js'}`, import.meta.url);
