// The PostgreSQL tests need a server: PARSIMETRY_TEST_PG_URL, e.g. the URL
// `scripts/postgres.sh start` prints. Missing in CI (CI=true) is a failure;
// missing locally skips loudly.
import type { Test } from 'tap';

export const PG_URL_ENV = 'PARSIMETRY_TEST_PG_URL';

export function requirePgUrl(t: Test): string | null {
  const url = process.env[PG_URL_ENV];
  if (url) return url;
  const message = `${PG_URL_ENV} is not set: start a server with \`scripts/postgres.sh start\` and export the URL it prints`;
  if (process.env.CI === 'true') {
    t.fail(message);
  } else {
    console.error(`\n*** SKIPPING PostgreSQL audit tests: ${message} ***\n`);
    t.plan(0, message);
  }
  return null;
}
