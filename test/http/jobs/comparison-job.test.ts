// The comparison job is the same pure function inline and on a worker; its
// last check measures the answer against MAX_RESULT_BYTES, so an answer the
// estimate let through but that came out larger is refused before any
// record — here forced with a cap below a small answer's size.
import t from 'tap';
import { comparisonJob } from '../../../src/http/jobs/comparison-job.ts';
import { ComparisonRequest } from '../../../src/http/schemas/comparison-request.ts';
import { DEFAULT_ACTIVE_POLICY } from '../../../src/policy-file.ts';

const body = ComparisonRequest.parse({
  data: { columns: { thickness: [30.1, 29.4, 31.2, 30.8, 29.9, 30.5, 31.0], lineSpeed: [50, 62, 41, 45, 58, 49, 44] } },
  response: 'thickness',
  candidates: [{ name: 'speed', terms: ['lineSpeed'] }, { name: 'level', terms: [] }],
});

t.test('an answer within the cap comes back whole', async (t) => {
  const out = comparisonJob({ kind: 'comparison', body, policy: DEFAULT_ACTIVE_POLICY, resultCap: { limit: 16 * 2 ** 20, setting: 'MAX_RESULT_BYTES' }, schemaCheck: true });
  t.ok('result' in out);
  if ('result' in out) t.same(out.result.models.map((m) => m.name), ['speed', 'level']);
});

t.test('an answer measured over the cap is refused with its measured size', async (t) => {
  const out = comparisonJob({ kind: 'comparison', body, policy: DEFAULT_ACTIVE_POLICY, resultCap: { limit: 2000, setting: 'MAX_RESULT_BYTES' }, schemaCheck: true });
  t.ok('issues' in out);
  if (!('issues' in out)) return;
  const [issue] = out.issues;
  t.match(issue, { code: 'result_size_limit', measured: true, limit: 2000, setting: 'MAX_RESULT_BYTES', unit: 'bytes' });
  t.ok((issue as { estimate: number }).estimate > 2000, 'the measured size is reported');
  t.match(issue.message, /came to .* MiB of JSON.*nothing was recorded/);
});
