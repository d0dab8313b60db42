// config -> keys -> logger -> store (and its chain head) -> compute pool -> app -> listen. The only place that opens a socket.
import pino from 'pino';
import { loadConfig, ConfigError, type Config } from './config.ts';
import { loggerOptions } from './logger.ts';
import { openAuditStore } from './audit/open.ts';
import { checkChainAtStart, describeFinding } from './audit/chain-at-start.ts';
import { buildApp, computePoolFor } from './http/app.ts';
import { KeyRing } from './http/security/key-ring.ts';
import { KeysFileError, loadKeysFile } from './http/security/keys-file.ts';
import { isLoopbackHost } from './http/security/loopback.ts';
import { closeGracefully } from './shutdown.ts';
import { warmUpMainThread } from './http/warm-up.ts';

function refuseToStart(message: string): never {
  process.stderr.write(`parsimetry: ${message}\n`);
  process.exit(2);
}

/** Settings that cannot work together stop the service before it opens anything. */
function startupChecks(): { config: Config; keys: KeyRing } {
  let config: Config;
  let keys: KeyRing;
  try {
    config = loadConfig();
    keys = config.apiKeysFile ? loadKeysFile(config.apiKeysFile) : KeyRing.empty();
  } catch (error) {
    if (error instanceof ConfigError || error instanceof KeysFileError) refuseToStart(error.message);
    throw error;
  }
  if (keys.open && !isLoopbackHost(config.host)) {
    refuseToStart(`HOST=${config.host} is not a loopback address and no API keys are configured (API_KEYS_FILE is unset). ` +
      'Without keys anyone who can reach the port could use the service, so it only listens on loopback ' +
      '(127.0.0.1, ::1, localhost). Set API_KEYS_FILE, or set HOST=127.0.0.1.');
  }
  return { config, keys };
}

async function main(): Promise<void> {
  const { config, keys } = startupChecks();
  const logger = pino(loggerOptions(config));
  const opened = await openAuditStore(config.auditDb);
  const { store, chain } = await checkChainAtStart(opened, config.auditDb,
    (err) => logger.warn({ err }, 'the audit chain head could not be written to its side file'));
  logger.info({ chainHead: chain.head, auditStore: store.backend }, `audit chain head at start: seq ${chain.head.seq}, hash ${chain.head.hash}`);
  if (chain.finding) logger.error({ chainFinding: chain.finding }, describeFinding(chain.finding, chain.witnessFile));
  // Started with the service and kept: the first request finds its workers warm.
  const compute = computePoolFor(config);
  compute.start();
  compute.on('start-failed', ({ slot, error }) => logger.error({ slot, err: error }, 'a compute worker failed to start; retrying'));
  compute.on('warm-up-failed', ({ slot, error }) => logger.warn({ slot, error }, 'a compute worker\'s warm-up failed; it serves without it'));
  const app = await buildApp({ config, store, logger, keys, processMetrics: true, compute, chainAtStart: chain });
  closeGracefully({ app, store, compute, logger, graceMs: config.shutdownGraceMs });
  if (config.computeWarmUp) {
    try {
      warmUpMainThread();
    } catch (err) {
      logger.warn({ err }, 'the warm-up comparison failed; serving without it');
    }
  }

  const address = await app.listen({ port: config.port, host: config.host });
  logger.info({ auditStore: store.backend, apiKeys: keys.size, computeWorkers: compute.size, address },
    `parsimetry listening on ${address} (docs at /docs)${keys.open ? '; open: no API keys configured' : ''}`);
}

main().catch((error) => {
  process.stderr.write(`parsimetry: failed to start: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
});
