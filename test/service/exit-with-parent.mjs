// Preloaded into service processes the tests start (node --import): when the
// test process goes away by any means (a timeout, a crash, a signal), the pipe
// on the child's stdin closes and the service goes too, so no test leaves a
// service listening. Test-only; the service itself never loads this. Plain
// JavaScript so the compiled service (no TypeScript loader) can preload it too.
// Main thread only: a worker thread that inherits the preload has a stdin of
// its own that ends at once, and must not take the process down with it.
import { isMainThread } from 'node:worker_threads';

if (isMainThread) {
  process.stdin.on('end', () => process.kill(process.pid, 'SIGKILL'));
  process.stdin.on('error', () => process.kill(process.pid, 'SIGKILL'));
  process.stdin.resume();
}
