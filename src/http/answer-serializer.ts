// How a comparison's answer is written out. Its result has already passed the
// response schema before it was recorded (representable.ts: a result that does
// not fit is a 422 and no record), so in production the reply is plain
// JSON.stringify; with RESPONSE_SCHEMA_CHECK=on (tests, the demo) the schema
// serializer checks it again as it goes out, so a drift between the check and
// the schema still fails a test.
import type { Config } from '../config.ts';

const plainJson = () => (data: unknown) => JSON.stringify(data);

/** Route options: none (the app's schema serializer) or a plain JSON serializer. */
export function answerSerializer(config: Pick<Config, 'responseSchemaCheck'>): { serializerCompiler?: typeof plainJson } {
  return config.responseSchemaCheck ? {} : { serializerCompiler: plainJson };
}
