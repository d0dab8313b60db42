// The order matters: hooks run in the order they are added. Cheap refusals come
// first (shutting down, overloaded), CORS headers are set before any refusal so a
// browser can read it, then access control names the caller, then the rate limit
// spends that caller's allowance. Everything here is added before any route, so
// every route gets every hook.
import type { FastifyInstance } from 'fastify';
import type { Config } from '../../config.ts';
import { installAccessControl } from '../security/access.ts';
import type { KeyRing } from '../security/key-ring.ts';
import { installMetrics } from '../metrics/metrics-plugin.ts';
import { registerBrowserPolicy } from './browser.ts';
import { refuseWhileClosing } from './closing.ts';
import { registerRateLimit } from './rate-limit.ts';
import { registerLoadShedding } from './under-pressure.ts';

export interface ServicePluginOptions {
  config: Config;
  keys: KeyRing;
  /** Process-wide metrics (CPU, memory): only for the app server.ts runs. */
  processMetrics?: boolean;
}

export async function registerServicePlugins(app: FastifyInstance, { config, keys, processMetrics }: ServicePluginOptions): Promise<void> {
  refuseWhileClosing(app);
  await registerLoadShedding(app, config.eventLoopMaxDelayMs);
  await registerBrowserPolicy(app, config.corsOrigins);
  installAccessControl(app, keys, { authFailuresPerMinute: config.authFailuresPerMinute });
  await registerRateLimit(app, config.rateLimitPerMinute);
  installMetrics(app, { processMetrics });
}
