// Plain-JS entry of a compute worker. Worker threads do not inherit the
// TypeScript loader that tsx or tap installed in the main thread (a known
// limitation of loader hooks and worker threads), so when the worker module
// is TypeScript source this registers tsx's loader in the worker first. A
// compiled build passes a .js module and this file stays as it is.
import { workerData } from 'node:worker_threads';

if (workerData.module.endsWith('.ts')) {
  const { register } = await import('tsx/esm/api');
  register();
}
await import(workerData.module);
