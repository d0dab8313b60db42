// POST /v1/summaries: a body of NDJSON (application/x-ndjson) or CSV
// (text/csv, header row) rows, folded into a data summary as it arrives, in
// constant memory (see summary-folder.ts). The answer's `data` pastes as the
// `data` of /v1/comparisons or /v1/searches; its `summary` is the same fixed
// data.summary form, kept for callers who already read it there.
// Nothing is recorded: a summary is an input, not a result. At most
// SUMMARY_UPLOADS_PER_CALLER uploads run at once per caller (uploads-in-flight.ts).
import type { Readable } from 'node:stream';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { SummaryUploadQuery, SummaryUploadResult } from '../schemas/summary.ts';
import { refusal, refusalTypes, sendRefusal } from '../plugins/refusal.ts';
import { ANONYMOUS, callerKey } from '../security/access.ts';
import { foldRows, type RowFormat } from './fold-body.ts';
import { BodyLimitError, RowError } from './row-error.ts';
import { UploadsInFlight } from './uploads-in-flight.ts';

/** Default limit of a streamed body: 2 GiB, some 30 million rows of five numbers as CSV. */
export const DEFAULT_SUMMARY_BODY_LIMIT_BYTES = 2 * 1024 ** 3;
/** A guess, not a promise: an upload that ends frees a place at once. */
const UPLOAD_RETRY_AFTER_SECONDS = 5;

const FORMATS: Record<string, RowFormat> = { 'application/x-ndjson': 'ndjson', 'text/csv': 'csv' };

export const summaryRoutes: FastifyPluginAsyncZod<{ bodyLimitBytes?: number; uploadsPerCaller: number }> = async (app, options) => {
  const limit = options.bodyLimitBytes ?? DEFAULT_SUMMARY_BODY_LIMIT_BYTES;
  const uploads = new UploadsInFlight(options.uploadsPerCaller);
  // Encapsulated in this plugin: the body reaches the handler as the raw stream, unread.
  app.addContentTypeParser(Object.keys(FORMATS), (_request, payload, done) => done(null, payload));

  app.post('/v1/summaries', {
    schema: {
      tags: ['searches'],
      summary: 'Fold streamed rows (NDJSON or CSV) into a data summary',
      description: `Send the rows as application/x-ndjson (one JSON object per line) or text/csv (a header row, then one record per line). Rows with a null or empty value in a listed column are left out (common rows); any other value that is not a finite number is a 400 naming the line. Memory is constant in the row count: (p + 1) × 8192 doubles for a block of rows plus O(p²). Body limit ${limit} bytes (SUMMARY_BODY_LIMIT_BYTES). At most ${options.uploadsPerCaller} uploads in flight at once per API key (per client address when open; SUMMARY_UPLOADS_PER_CALLER): one more is a 429 with Retry-After, before its body is read.`,
      querystring: SummaryUploadQuery,
      consumes: Object.keys(FORMATS),
      response: {
        200: SummaryUploadResult, 400: ProblemSchema, 413: ProblemSchema, 415: ProblemSchema, 422: ProblemSchema,
        429: {
          description: 'The caller already has SUMMARY_UPLOADS_PER_CALLER uploads in flight (refused before the body is read; Retry-After), or a rate limit as for every keyed operation.',
          content: { 'application/json': { schema: ProblemSchema } },
        },
      },
    },
  }, async (request, reply) => {
    const type = String(request.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    const format = FORMATS[type];
    const body = request.body as unknown;
    if (!format || !body || typeof (body as Readable).pipe !== 'function') {
      return reply.code(415).type(PROBLEM_CONTENT_TYPE).send(problem(415, problemTypes.unsupportedMediaType, 'Unsupported media type',
        `send the rows as application/x-ndjson or text/csv (got ${JSON.stringify(request.headers['content-type'] ?? 'none')})`));
    }
    const caller = callerKey(request);
    if (!uploads.enter(caller)) {
      return sendRefusal(reply.header('connection', 'close'), refusal(429, refusalTypes.uploadsInFlight, 'Too many uploads in flight',
        `${request.caller === ANONYMOUS ? 'this client' : `the key "${request.caller}"`} already has ${uploads.perCaller} uploads in flight (SUMMARY_UPLOADS_PER_CALLER=${uploads.perCaller}); send this one when one of them has finished`,
        { limit: uploads.perCaller, setting: 'SUMMARY_UPLOADS_PER_CALLER', retryAfterSeconds: UPLOAD_RETRY_AFTER_SECONDS },
        { 'retry-after': String(UPLOAD_RETRY_AFTER_SECONDS) }));
    }
    const { columns, weights } = request.query;
    try {
      const folded = await foldRows(body as Readable, { format, columns, weights, maxBodyBytes: limit });
      if (!folded.summary) {
        return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(problem(422, problemTypes.cannotCompute, 'The request is well-formed but cannot be computed',
          `no complete rows: ${folded.rowsRead} rows read, ${folded.rowsDropped} with a missing value`, { errors: [{ path: '', message: 'no complete rows to summarise', code: 'summary_rows_invalid' }] }));
      }
      const overflow = firstNonFinite(folded.summary);
      if (overflow) {
        return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(problem(422, problemTypes.cannotCompute, 'The summary cannot be represented',
          `the sums of column ${JSON.stringify(overflow)} overflow 64-bit floating point; rescale that column and send again`,
          { errors: [{ path: `columns/${overflow}`, message: 'sums beyond double precision', code: 'summary_not_representable' }] }));
      }
      return reply.code(200).send({ data: { summary: folded.summary }, summary: folded.summary, rowsRead: folded.rowsRead, rowsDropped: folded.rowsDropped, bytes: folded.bytes });
    } catch (error) {
      if (error instanceof RowError) {
        return reply.code(400).header('connection', 'close').type(PROBLEM_CONTENT_TYPE).send(problem(400, problemTypes.invalidRequest, 'A row of the body is malformed', error.message,
          { line: error.line, errors: [{ path: `line/${error.line}`, message: error.reason }] }));
      }
      if (error instanceof BodyLimitError) {
        return reply.code(413).header('connection', 'close').type(PROBLEM_CONTENT_TYPE).send(problem(413, problemTypes.bodyTooLarge, 'Request body too large',
          `the streamed body exceeds the limit of ${limit} bytes (SUMMARY_BODY_LIMIT_BYTES); summarise parts and merge them`, { limit }));
      }
      throw error;
    } finally {
      uploads.leave(caller);
    }
  });
};

/** The first column whose mean or cross products are not finite, or null. */
function firstNonFinite(summary: { columns: string[]; means: number[]; centredCrossProducts: number[][] }): string | null {
  for (let j = 0; j < summary.columns.length; j++) {
    if (!Number.isFinite(summary.means[j]) || summary.centredCrossProducts[j].some((v) => !Number.isFinite(v))) return summary.columns[j];
  }
  return null;
}
