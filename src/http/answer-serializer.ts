// How a comparison's answer is written out. Its result has already passed the
// response schema before it was recorded (representable.ts: a result that does
// not fit is a 422 and no record), so in production the reply is plain
// JSON.stringify; with RESPONSE_SCHEMA_CHECK=on (tests, the demo) the schema
// serializer checks it again as it goes out, so a drift between the check and
// the schema still fails a test.
import type { FastifyReply } from 'fastify';
import type { Config } from '../config.ts';

const plainJson = () => (data: unknown) => JSON.stringify(data);

/** Route options: none (the app's schema serializer) or a plain JSON serializer. */
export function answerSerializer(config: Pick<Config, 'responseSchemaCheck'>): { serializerCompiler?: typeof plainJson } {
  return config.responseSchemaCheck ? {} : { serializerCompiler: plainJson };
}

/**
 * The text JSON.stringify({ ...envelope, ...result }) writes, made from the
 * result's text already written (resultJson is JSON.stringify(result)) rather
 * than by walking the result again. null when the two would differ: a result
 * that repeats an envelope key, or an empty one.
 */
export function answerJson(envelope: Record<string, string>, result: object, resultJson: string): string | null {
  const keys = Object.keys(envelope);
  if (keys.length === 0 || resultJson.length < 3 || resultJson[0] !== '{' || keys.some((k) => Object.hasOwn(result, k))) return null;
  const head = JSON.stringify(envelope);
  return `${head.slice(0, -1)},${resultJson.slice(1)}`;
}

/** A 200 whose JSON is already written: sent as it is (no serializer runs on a string with a JSON type). */
export function sendJsonText(reply: FastifyReply, text: string): FastifyReply {
  return reply.code(200).type('application/json; charset=utf-8').send(text);
}
