// config -> logger -> store -> app -> listen. The only place that opens a socket.
import pino from 'pino';
import { loadConfig, ConfigError } from './config.ts';
import { loggerOptions } from './logger.ts';
import { openAuditStore } from './audit/open.ts';
import { buildApp } from './http/app.ts';

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig();
  } catch (error) {
    if (error instanceof ConfigError) {
      process.stderr.write(`parsimetry: ${error.message}\n`);
      process.exit(2);
    }
    throw error;
  }
  const logger = pino(loggerOptions(config));
  const store = await openAuditStore(config.auditDb);
  const app = await buildApp({ config, store, logger });

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    logger.info({ signal }, 'shutting down: finishing requests in flight');
    // fastify's close waits for in-flight requests, whose audit records commit
    // before their replies; only then is the store closed.
    await app.close();
    await store.close();
    logger.info('stopped');
    process.exit(0);
  };
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGINT', () => void shutdown('SIGINT'));

  await app.listen({ port: config.port, host: config.host });
  logger.info({ auditStore: store.backend }, `parsimetry listening on http://${config.host}:${config.port} (docs at /docs)`);
}

main().catch((error) => {
  process.stderr.write(`parsimetry: failed to start: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
