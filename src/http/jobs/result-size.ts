// The answer's size, measured as the JSON it will be sent and recorded as,
// against MAX_RESULT_BYTES: the second check, after the estimate made before
// any work. An answer over the cap is refused before anything is recorded.
import { issue, type Issue } from '../../core/issues.ts';
import type { Cap } from '../../core/pricing/index.ts';

// The text is the one the record stores and the answer sends (comparisons pass it on), so it is written once.
export function resultSizeIssue(resultJson: string, cap: Cap, remedy: string): Issue | null {
  const bytes = Buffer.byteLength(resultJson);
  if (bytes <= cap.limit) return null;
  return issue('result_size_limit', [], { estimate: bytes, ...cap, unit: 'bytes', measured: true, largest: 'the whole answer', remedy });
}
