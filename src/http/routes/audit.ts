// GET /v1/audit/verify: the whole chain re-hashed, as the store's VerifyReport.
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { RawRecord, RecordParams, VerifyReportSchema } from '../schemas/record.ts';
import { notFound, replyToStoreReadError } from './records.ts';

export const auditRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/v1/audit/verify', {
    schema: {
      tags: ['audit'],
      summary: 'Re-hash the whole audit chain and say whether it is intact',
      description: [
        'Walks every record in chain order, recomputes each hash from the previous hash and the record\'s canonical content, and compares the end of the chain with the head the store committed.',
        'The answer is 200 whether or not the chain is intact: a broken chain is a finding, not a failed request. Read `ok`.',
        'When `ok` is false: stop relying on records at or after `firstBroken.seq` and treat the audit store as a possible incident; keep a copy of the database as it is; compare with a backup or with a `head.hash` pinned outside the database earlier; records before `firstBroken.seq` still verify.',
        '`reason`: hash_mismatch (content edited), unreadable (row damaged), sequence_gap (a record missing or reordered), prev_hash_mismatch (a record replaced or reordered), head_mismatch (newest records removed, or rows added behind the store).',
        'Pin `head.hash` somewhere else from time to time: anyone able to rewrite the database could rewrite the whole chain consistently, and only an outside copy of an earlier head detects that.',
        'The walk reads every record; on a long chain it takes a while and loads the database. It reads pages of at most 1000 rows or 8 MiB of bodies and checks rows over 256 KiB in a worker thread, so its memory stays bounded and the service keeps answering other requests meanwhile.',
      ].join('\n\n'),
      response: { 200: VerifyReportSchema, 503: ProblemSchema },
    },
  }, async (_request, reply) => {
    try {
      return reply.code(200).send(await store.verify());
    } catch (error) {
      return replyToStoreReadError(error, reply);
    }
  });

  app.get('/v1/audit/records/:id', {
    schema: {
      tags: ['audit'],
      summary: 'One audit record exactly as it is hashed, to check its hash outside the service',
      description:
        'hash = hex SHA-256 of the UTF-8 bytes of prevHash followed by the canonical JSON (sorted keys, no white space, numbers as ECMAScript prints them; RFC 8785 for these values) of this object without its prevHash and hash fields. The first record\'s prevHash is 64 zeros.',
      params: RecordParams,
      response: { 200: RawRecord, 400: ProblemSchema, 404: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    try {
      const record = await store.get(request.params.id);
      if (!record) return notFound(reply, request.params.id, 'record');
      return reply.code(200).send(record);
    } catch (error) {
      return replyToStoreReadError(error, reply);
    }
  });
};
