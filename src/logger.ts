// pino options in one place: JSON lines for machines, and never a credential in a log.
import type { LoggerOptions } from 'pino';
import type { Config } from './config.ts';

export function loggerOptions(config: Pick<Config, 'logLevel'>): LoggerOptions {
  return {
    level: config.logLevel,
    // An Authorization header carries an API key in clear; logs are read by more
    // people than keys are given to.
    redact: {
      paths: ['req.headers.authorization', 'req.headers["x-api-key"]', 'headers.authorization'],
      censor: '[redacted]',
    },
  };
}
