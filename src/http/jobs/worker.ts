// A compute worker: runs the jobs of src/http/jobs as the pool sends them,
// after running the worked examples once when the pool asks (COMPUTE_WARM_UP).
import { workerData } from 'node:worker_threads';
import { serveJobs, type WarmUpOutcome } from '../../compute/worker-loop.ts';
import { warmUpWorker } from '../warm-up.ts';
import { runJob, type Job } from './index.ts';
import { fromMain } from './transport.ts';

async function warmUp(): Promise<WarmUpOutcome> {
  if (!(workerData as { warmUp?: boolean } | null)?.warmUp) return 'off';
  try {
    await warmUpWorker();
    return 'done';
  } catch (err) {
    // A warm-up that failed must not keep this worker from serving; the pool reports it.
    return { failed: err instanceof Error ? `${err.name}: ${err.message}` : String(err) };
  }
}

serveJobs((message) => runJob(fromMain(message) as Job), await warmUp());
