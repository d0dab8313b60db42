// Graceful shutdown: on SIGTERM (or SIGINT) the listener stops, requests still
// arriving are refused (src/http/plugins/closing.ts), requests in flight finish —
// each commits its audit record before its reply — and only then are the
// compute workers stopped, the chain head logged and the store closed (an SQLite
// store writes its head witness). Past SHUTDOWN_GRACE_MS the process stops anyway, with exit code 1.
import closeWithGrace from 'close-with-grace';
import type { FastifyInstance } from 'fastify';
import type { Logger } from 'pino';
import type { AuditStore } from './audit/store.ts';
import type { ComputePool } from './compute/index.ts';

export function closeGracefully({ app, store, compute, logger, graceMs }: {
  app: FastifyInstance;
  store: AuditStore;
  compute: ComputePool;
  logger: Logger;
  graceMs: number;
}): void {
  closeWithGrace({
    delay: graceMs,
    logger: { error: (message: unknown) => logger.error(String(message)) },
  }, async ({ signal, err }) => {
    if (err) logger.error({ err }, 'stopping after an unhandled error');
    else logger.info({ signal }, 'shutting down: finishing requests in flight');
    await app.close();
    await compute.close();
    // After the last request's record: the head an operator can compare with the next start's.
    const head = await store.head().catch(() => null);
    if (head) logger.info({ chainHead: head }, `audit chain head at shutdown: seq ${head.seq}, hash ${head.hash}`);
    await store.close();
    logger.info('stopped');
  });
}
