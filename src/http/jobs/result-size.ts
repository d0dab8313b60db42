// The answer's size, measured as the JSON it will be sent and recorded as,
// against MAX_RESULT_BYTES: the second check, after the estimate made before
// any work. An answer over the cap is refused before anything is recorded.
import { issue, type Issue } from '../../core/issues.ts';
import type { Cap } from '../../core/pricing/index.ts';

export function resultSizeIssue(result: unknown, cap: Cap, remedy: string): Issue | null {
  const bytes = Buffer.byteLength(JSON.stringify(result));
  if (bytes <= cap.limit) return null;
  return issue('result_size_limit', [], { estimate: bytes, ...cap, unit: 'bytes', measured: true, largest: 'the whole answer', remedy });
}
