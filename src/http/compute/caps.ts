// The caps every price is held against, each with the setting that sets it.
import type { Config } from '../../config.ts';
import type { PriceCaps } from '../../core/pricing/index.ts';

export function priceCaps(config: Config): PriceCaps {
  return {
    work: { limit: config.maxRequestWork, setting: 'MAX_REQUEST_WORK' },
    memoryBytes: { limit: config.maxRequestMemoryBytes, setting: 'MAX_REQUEST_MEMORY_BYTES' },
    resultBytes: { limit: config.maxResultBytes, setting: 'MAX_RESULT_BYTES' },
    designColumns: { limit: config.maxDesignColumns, setting: 'MAX_DESIGN_COLUMNS' },
  };
}
