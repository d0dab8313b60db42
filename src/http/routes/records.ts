// Reading the audit record back: one stored comparison or search, each checked
// for integrity as it is read, and pages of comparisons or of searches.
import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { AuditCursorInvalid, AuditQueryInvalid, AuditRecordCorrupt, AuditUnavailable } from '../../audit/errors.ts';
import { recordIntegrity, type RecordIntegrity } from '../../audit/integrity.ts';
import type { AuditStore, RecordKind, StoredRecord } from '../../audit/store.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { ComparisonList, ListQuerySchema, RecordParams, SearchList, StoredComparison, StoredSearch } from '../schemas/record.ts';

/**
 * A store failure while reading, as a reply: an unreachable store is 503 (try
 * again), a row that no longer reads back is our fault, never the caller's (500,
 * saying which record and what to run). Anything else is rethrown.
 */
export function replyToStoreReadError(error: unknown, reply: FastifyReply): FastifyReply {
  if (error instanceof AuditUnavailable) {
    reply.log.error({ err: error }, 'audit store unavailable for a read');
    return reply.code(503).header('retry-after', '5').type(PROBLEM_CONTENT_TYPE).send(
      problem(503, problemTypes.storeUnavailable, 'Audit store unavailable', 'the audit store cannot be read just now; retry later'));
  }
  if (error instanceof AuditRecordCorrupt) {
    reply.log.error({ err: error, seq: error.seq, problems: error.problems }, 'stored audit record is unreadable');
    return reply.code(500).type(PROBLEM_CONTENT_TYPE).send(
      problem(500, problemTypes.internal, 'Stored record unreadable',
        `the stored record ${error.seq} no longer reads back; run GET /v1/audit/verify`, { seq: error.seq }));
  }
  throw error;
}

export function notFound(reply: FastifyReply, id: string, kind: RecordKind | 'record' = 'comparison'): FastifyReply {
  return reply.code(404).type(PROBLEM_CONTENT_TYPE).send(
    problem(404, problemTypes.notFound, 'Not found', `no ${kind} with id ${id}`));
}

const recordPaths: Record<RecordKind, string> = { comparison: '/v1/comparisons', search: '/v1/searches' };

/** A record of the other kind: still a 404 here, but saying what the id is and where to read it. */
function otherKind(reply: FastifyReply, id: string, asked: RecordKind, found: RecordKind): FastifyReply {
  const href = `${recordPaths[found]}/${id}`;
  return reply.code(404).type(PROBLEM_CONTENT_TYPE).send(
    problem(404, problemTypes.notFound, 'Not found', `${id} is a ${found}, not a ${asked}: read it at GET ${href}`, { recordKind: found, href }));
}

/** The stored record of that kind, or a reply already sent (404, 500, 503). */
export async function getRecord(store: AuditStore, id: string, reply: FastifyReply, kind: RecordKind): Promise<StoredRecord | null> {
  let record: StoredRecord | null;
  try {
    record = await store.get(id);
  } catch (error) {
    replyToStoreReadError(error, reply);
    return null;
  }
  if (!record) {
    notFound(reply, id, kind);
    return null;
  }
  // Comparisons and searches each live under their own path.
  if (record.kind !== kind) {
    otherKind(reply, id, kind, record.kind);
    return null;
  }
  return record;
}

export const getComparison = (store: AuditStore, id: string, reply: FastifyReply) => getRecord(store, id, reply, 'comparison');

/** The record with its integrity checked against its neighbours, or a reply already sent. */
export async function readRecord(
  store: AuditStore, id: string, reply: FastifyReply, kind: RecordKind,
): Promise<{ record: StoredRecord; integrity: RecordIntegrity } | null> {
  const record = await getRecord(store, id, reply, kind);
  if (!record) return null;
  let integrity: RecordIntegrity;
  try {
    integrity = recordIntegrity(record, await store.chainLinks(record.seq));
  } catch (error) {
    replyToStoreReadError(error, reply);
    return null;
  }
  if (!integrity.ok) reply.log.error({ seq: record.seq, id: record.id, reason: integrity.reason }, 'a stored record failed its integrity check on read');
  return { record, integrity };
}

/** The POST response exactly: the route stores the result without the fields the envelope holds. */
export function answeredResult(record: StoredRecord): Record<string, unknown> {
  return { id: record.id, createdAt: record.createdAt, serviceVersion: record.serviceVersion, ...record.result };
}

function requestSummary(request: Record<string, unknown> | null) {
  if (request === null) return null;
  const data = request.data as { columns?: Record<string, unknown[]> } | undefined;
  const columns = data?.columns && typeof data.columns === 'object' ? Object.keys(data.columns) : [];
  const first = columns.length ? data!.columns![columns[0]] : null;
  const candidates = Array.isArray(request.candidates) ? request.candidates : [];
  return {
    candidates: candidates.map((c) => String((c as { name?: unknown })?.name ?? '')),
    response: typeof request.response === 'string' ? request.response : null,
    rows: Array.isArray(first) ? first.length : null,
    columns,
  };
}

function queryProblem(reply: FastifyReply, path: string, message: string): FastifyReply {
  return reply.code(400).type(PROBLEM_CONTENT_TYPE).send(
    problem(400, problemTypes.invalidRequest, 'The request does not match the schema', `${path}: ${message}`,
      { errors: [{ path, message }] }));
}

/** What every stored record answers besides its kind and result. */
function envelope(record: StoredRecord) {
  return {
    id: record.id,
    createdAt: record.createdAt,
    caller: record.caller,
    label: record.label,
    serviceVersion: record.serviceVersion,
    conventionsVersion: record.conventionsVersion,
    policy: record.policy,
    datasetFingerprint: record.datasetFingerprint,
    requestDigest: record.requestDigest,
    requestSummary: requestSummary(record.request),
    request: record.request,
    chain: { seq: record.seq, prevHash: record.prevHash, hash: record.hash },
  };
}

function readDescription(kind: RecordKind, made: string): string {
  const other: RecordKind = kind === 'comparison' ? 'search' : 'comparison';
  return [
    `The ${kind} as ${made} answered it (\`result\`), the request as sent (or only its digest), and its place in the audit chain (\`chain\`).`,
    '`integrity` is checked on every read: the record\'s hash recomputed from its content, its link to the record before it, and the link of the record after it (or the committed head) to it. A record edited in the database is still answered, with `integrity.ok` false and the reason; do not rely on it, and run GET /v1/audit/verify.',
    `An id of a ${other} is a 404 that says so and where to read it (\`href\`).`,
  ].join('\n\n');
}

export const recordRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/v1/comparisons/:id', {
    schema: {
      tags: ['audit'],
      summary: 'One stored comparison: request summary, the result as it was answered, and its place in the audit chain',
      description: readDescription('comparison', 'POST /v1/comparisons'),
      params: RecordParams,
      response: { 200: StoredComparison, 400: ProblemSchema, 404: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const read = await readRecord(store, request.params.id, reply, 'comparison');
    if (!read) return reply;
    return reply.code(200).send({ ...envelope(read.record), kind: 'comparison' as const, result: answeredResult(read.record), integrity: read.integrity });
  });

  app.get('/v1/searches/:id', {
    schema: {
      tags: ['searches'],
      summary: 'One stored search: request summary, the result as it was answered, and its place in the audit chain',
      description: readDescription('search', 'POST /v1/searches'),
      params: RecordParams,
      response: { 200: StoredSearch, 400: ProblemSchema, 404: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema },
    },
  }, async (request, reply) => {
    const read = await readRecord(store, request.params.id, reply, 'search');
    if (!read) return reply;
    return reply.code(200).send({ ...envelope(read.record), kind: 'search' as const, result: answeredResult(read.record), integrity: read.integrity });
  });


  for (const kind of ['comparison', 'search'] as const) {
    app.get(recordPaths[kind], {
      schema: {
        tags: [kind === 'comparison' ? 'audit' : 'searches'],
        summary: `Stored ${kind === 'comparison' ? 'comparisons' : 'searches'}, newest first, in pages`,
        description: [
          'Filters combine (AND). Follow nextCursor until it is null to walk every match; a page may be shorter than limit only at the end.',
          `Only ${kind === 'comparison' ? 'comparisons' : 'searches'} are listed here; ${kind === 'comparison' ? 'searches are at GET /v1/searches' : 'comparisons are at GET /v1/comparisons'}, with the same filters and paging.`,
        ].join('\n\n'),
        querystring: ListQuerySchema,
        response: { 200: kind === 'comparison' ? ComparisonList : SearchList, 400: ProblemSchema, 503: ProblemSchema },
      },
    }, async (request, reply) => {
      let page;
      try {
        page = await store.list({ ...request.query, kind });
      } catch (error) {
        if (error instanceof AuditCursorInvalid) return queryProblem(reply, 'cursor', 'not a cursor this service issued; start again without one');
        if (error instanceof AuditQueryInvalid) {
          const [field, ...rest] = error.problems[0].split(': ');
          return queryProblem(reply, field, rest.join(': ') || error.message);
        }
        return replyToStoreReadError(error, reply);
      }
      return reply.code(200).send({
        records: page.records.map((r) => ({
          id: r.id,
          createdAt: r.createdAt,
          kind,
          caller: r.caller,
          label: r.label,
          datasetFingerprint: r.datasetFingerprint,
          best: r.best,
          seq: r.seq,
          hash: r.hash,
        })),
        unreadable: page.corrupt.map((c) => ({ seq: c.seq, id: c.id })),
        nextCursor: page.nextCursor,
      });
    });
  }
};
