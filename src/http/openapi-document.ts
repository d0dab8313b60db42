// The OpenAPI document as text, built from the registered routes' zod schemas.
// Used by scripts/export-openapi.ts and by the drift test.
import { defaultConfig } from '../config.ts';
import { openAuditStore } from '../audit/open.ts';
import { buildApp } from './app.ts';

export async function openapiDocument(): Promise<string> {
  const store = await openAuditStore(':memory:');
  const app = await buildApp({ config: defaultConfig(), store, logger: false });
  try {
    await app.ready();
    return `${JSON.stringify(app.swagger(), null, 2)}\n`;
  } finally {
    await app.close();
    await store.close();
  }
}
