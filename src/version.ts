// The service version recorded in every audit record and response, read from
// package.json so there is one place to bump it.
import { readFileSync } from 'node:fs';

const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };

export const serviceVersion: string = pkg.version;
