// Prometheus metrics, one registry per app so that tests building several apps
// in one process never share counters. Names follow Prometheus conventions
// (base units: seconds; counters end in _total).
import { Counter, Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client';
import type { HeadFinding } from '../../audit/head-witness.ts';
import type { PoolStats } from '../../compute/index.ts';

export interface ServiceMetrics {
  readonly registry: Registry;
  readonly httpRequests: Counter<'route' | 'method' | 'status'>;
  readonly httpDuration: Histogram<'route' | 'method' | 'status'>;
  readonly comparisons: Counter;
  readonly modelsFitted: Counter;
  readonly searches: Counter;
  readonly auditAppendDuration: Histogram;
  readonly auditAppendFailures: Counter;
  readonly chainFindings: Counter<'kind'>;
  readonly chainRecordsMissing: Gauge;
  /** Counts a finding of the start's chain check (src/audit/chain-at-start.ts). */
  recordChainFinding(finding: HeadFinding): void;
  /** Requests the compute pool turned away or stopped: busy, compute-deadline, compute-memory, client_gone. */
  readonly computeRefusals: Counter<'reason'>;
  readonly computeWorkersReplaced: Counter;
  /** Reports the pool's state on every scrape. */
  watchPool(stats: () => PoolStats): void;
}

export function createServiceMetrics(options: { processMetrics?: boolean } = {}): ServiceMetrics {
  const registry = new Registry();
  // Process metrics (CPU, memory, event loop lag) for the whole process: only the
  // app that server.ts runs should report them.
  if (options.processMetrics) collectDefaultMetrics({ register: registry, prefix: 'parsimetry_' });
  const registers = [registry];
  return {
    registry,
    httpRequests: new Counter({
      name: 'parsimetry_http_requests_total', help: 'HTTP requests answered, by route pattern, method and status',
      labelNames: ['route', 'method', 'status'], registers,
    }),
    httpDuration: new Histogram({
      name: 'parsimetry_http_request_duration_seconds', help: 'Time from receiving a request to sending its reply',
      labelNames: ['route', 'method', 'status'], registers,
      buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30],
    }),
    comparisons: new Counter({ name: 'parsimetry_comparisons_total', help: 'Comparisons computed and recorded', registers }),
    modelsFitted: new Counter({ name: 'parsimetry_models_fitted_total', help: 'Candidate models fitted here by least squares (not those scored from figures fitted elsewhere)', registers }),
    searches: new Counter({ name: 'parsimetry_searches_total', help: 'Subset searches computed and recorded', registers }),
    auditAppendDuration: new Histogram({
      name: 'parsimetry_audit_append_duration_seconds', help: 'Time for the audit store to commit one record',
      registers, buckets: [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5],
    }),
    auditAppendFailures: new Counter({ name: 'parsimetry_audit_append_failures_total', help: 'Records the audit store refused (each turned its reply into a 503)', registers }),
    chainFindings: new Counter({
      name: 'parsimetry_audit_chain_head_findings_total', labelNames: ['kind'], registers,
      help: 'Starts that found the SQLite chain head behind (kind="behind") or different from (kind="rewritten") the head last seen in its side file',
    }),
    chainRecordsMissing: new Gauge({
      name: 'parsimetry_audit_chain_records_missing', registers,
      help: 'Records the head last seen had that the SQLite chain did not have at start (0: none missing)',
    }),
    recordChainFinding(finding) {
      this.chainFindings.inc({ kind: finding.kind });
      this.chainRecordsMissing.set(finding.missing);
    },
    computeRefusals: new Counter({
      name: 'parsimetry_compute_refusals_total', help: 'Requests the compute pool refused (queue full) or stopped (deadline, worker heap, client gone), by reason',
      labelNames: ['reason'], registers,
    }),
    computeWorkersReplaced: new Counter({ name: 'parsimetry_compute_workers_replaced_total', help: 'Compute workers terminated (deadline, cancellation) or lost and started afresh', registers }),
    watchPool(stats) {
      const gauge = (name: string, help: string, read: (s: PoolStats) => number) =>
        new Gauge({ name, help, registers, collect() { this.set(read(stats())); } });
      gauge('parsimetry_compute_workers', 'Worker threads of the compute pool (COMPUTE_WORKERS)', (s) => s.workers);
      gauge('parsimetry_compute_workers_busy', 'Compute workers running a piece of work now', (s) => s.busy);
      gauge('parsimetry_compute_queue_pieces', 'Pieces of work waiting for a compute worker', (s) => s.waiting);
      gauge('parsimetry_compute_requests', 'Requests admitted to the compute pool and not finished (at most COMPUTE_WORKERS + COMPUTE_QUEUE_LENGTH)', (s) => s.sessions);
    },
  };
}
