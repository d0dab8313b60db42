// pino options in one place: JSON lines for machines, and never a credential in a log.
import type { LoggerOptions } from 'pino';
import type { Config } from './config.ts';

/**
 * The path of a request URL with its query string replaced by a marker. A
 * caller may put anything in a query string, an API key included ("?key=…",
 * or a bare "?pk_…"), and the service reads no secret from there, so none of
 * it is worth the risk of writing down.
 */
export function redactedUrl(url: string): string {
  const query = url.indexOf('?');
  return query < 0 ? url : `${url.slice(0, query)}?[redacted]`;
}

interface LoggedRequest {
  method?: string;
  url?: string;
  host?: string;
  ip?: string;
  socket?: { remotePort?: number };
}

export function loggerOptions(config: Pick<Config, 'logLevel'>): LoggerOptions {
  return {
    level: config.logLevel,
    // An Authorization header carries an API key in clear; logs are read by more
    // people than keys are given to.
    redact: {
      paths: ['req.headers.authorization', 'req.headers["x-api-key"]', 'headers.authorization'],
      censor: '[redacted]',
    },
    serializers: {
      // Replaces fastify's request serializer (fastify lets the logger's own
      // serializers win): the same fields, with the query string redacted.
      req: (request: LoggedRequest) => ({
        method: request.method,
        url: typeof request.url === 'string' ? redactedUrl(request.url) : undefined,
        host: request.host,
        remoteAddress: request.ip,
        remotePort: request.socket?.remotePort,
      }),
    },
  };
}
