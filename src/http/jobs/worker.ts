// A compute worker: runs the jobs of src/http/jobs as the pool sends them.
import { serveJobs } from '../../compute/worker-loop.ts';
import { runJob, type Job } from './index.ts';
import { fromMain } from './transport.ts';

serveJobs((message) => runJob(fromMain(message) as Job));
