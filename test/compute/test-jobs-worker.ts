// A compute worker for the pool's own tests: jobs that echo, spin for a
// while, throw, or eat their heap. Not part of the service.
import { serveJobs } from '../../src/compute/worker-loop.ts';

type TestJob = { kind: 'echo'; value: unknown } | { kind: 'spin'; ms: number } | { kind: 'throw' } | { kind: 'hog' };

serveJobs((job) => {
  const j = job as TestJob;
  switch (j.kind) {
    case 'echo':
      return j.value;
    case 'spin': {
      // A tight loop, as a long computation is: only terminating the thread stops it.
      const end = Date.now() + j.ms;
      let spins = 0;
      while (Date.now() < end) spins++;
      return spins;
    }
    case 'throw':
      throw new RangeError('a job that fails on purpose');
    case 'hog': {
      const kept: number[][] = [];
      for (;;) kept.push(new Array(1 << 20).fill(1.5));
    }
  }
});
