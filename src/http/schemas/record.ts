// Shapes of the audit endpoints: a stored comparison, a page of them, the chain
// verification report and a replay report. Query and path parameters too.
import { z } from 'zod';
import { integrityReasons } from '../../audit/integrity.ts';
import { LIST_LIMIT_DEFAULT, LIST_LIMIT_MAX } from '../../audit/store.ts';
import { decimalQueryInteger } from './common.ts';
import { ComparisonResult } from './comparison-response.ts';

const hex64 = z.string().meta({ description: '64 lowercase hex characters (SHA-256).' });

/** The ids the store issues (UUIDv7 form); anything else cannot name a record. */
export const RecordId = z
  .string()
  .regex(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/, 'not a record id (a lowercase UUIDv7, as POST /v1/comparisons and POST /v1/searches return)')
  .meta({ description: 'The id POST /v1/comparisons (or, under /v1/searches, POST /v1/searches) returned.' });

export const RecordParams = z.strictObject({ id: RecordId });

const isoDate = z.iso.date();
const isoDateTime = z.iso.datetime({ offset: true });
const Instant = z
  .string()
  .refine((v) => isoDate.safeParse(v).success || isoDateTime.safeParse(v).success, {
    message: 'expected an ISO 8601 date (2026-03-01) or a date-time with a zone (2026-03-01T08:00:00Z)',
  });

export const ListQuerySchema = z
  .strictObject({
    cursor: z.string().min(1).max(200).optional().meta({ description: 'nextCursor of the previous page; absent for the newest page.' }),
    limit: decimalQueryInteger('limit', 1, LIST_LIMIT_MAX)
      .optional()
      .meta({ description: `Page size, 1..${LIST_LIMIT_MAX} in decimal digits (default ${LIST_LIMIT_DEFAULT}).` }),
    fingerprint: z
      .string()
      .regex(/^sha256:[0-9a-f]{64}$/, 'expected "sha256:" and 64 lowercase hex digits, as dataset.fingerprint reads')
      .optional()
      .meta({ description: 'Only records of this dataset.fingerprint ("sha256:" and 64 lowercase hex digits).' }),
    caller: z.string().min(1).max(200).optional().meta({ description: 'Only records made by this API key id ("anonymous" without keys).' }),
    label: z.string().max(1000).optional().meta({ description: 'Only records whose label contains this text (case-sensitive); empty matches every record.' }),
    from: Instant.optional().meta({ description: 'Only records created at or after this instant (a date means its midnight UTC).' }),
    to: Instant.optional().meta({ description: 'Only records created before this instant.' }),
  })
  .superRefine((q, ctx) => {
    if (q.from !== undefined && q.to !== undefined && Date.parse(q.from) >= Date.parse(q.to)) {
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'to must be later than from' });
    }
  });

export const ChainPosition = z
  .strictObject({
    seq: z.number().int().positive().meta({ description: 'Position in the audit chain (1 is the first record ever kept).' }),
    prevHash: hex64,
    hash: hex64.meta({ description: 'SHA-256 over prevHash and the canonical record (see the audit README).' }),
  })
  .meta({ id: 'ChainPosition' });

export const RequestSummary = z
  .strictObject({
    candidates: z.array(z.string()).meta({ description: 'Candidate names in request order.' }),
    response: z.string().nullable().meta({ description: 'null for a request without data (candidates sent by rss or logLikelihood).' }),
    rows: z.number().int().nullable().meta({ description: 'Rows sent (before rows with missing values were dropped); null without data.' }),
    columns: z.array(z.string()),
  })
  .meta({ id: 'RequestSummary' });

const jsonObject = z.record(z.string(), z.unknown());

export const RecordIntegrity = z
  .strictObject({
    ok: z.boolean().meta({ description: 'true when every check passed.' }),
    reason: z.enum(integrityReasons).nullable().meta({
      description:
        'The first check that failed, null when ok: hash_mismatch (content edited), prev_hash_mismatch (it does not name the stored hash of the record before it), sequence_gap (a neighbouring record is missing), next_link_mismatch (the record after it names another hash: this one was rewritten with a new hash, or the next replaced), head_mismatch (it is the newest record but the committed head disagrees).',
    }),
    detail: z.string().meta({ description: 'The finding in words, with the positions it concerns, and what to do when it failed.' }),
  })
  .meta({
    id: 'RecordIntegrity',
    description:
      'Checked on every read: the record\'s own hash recomputed from its content, its link to the record before it, and the link of the record after it (or the committed head) to it. A whole-chain rewrite by someone with database access passes; only GET /v1/audit/verify against a head.hash kept elsewhere detects that.',
  });

export const StoredComparison = z
  .strictObject({
    id: z.string(),
    createdAt: z.string(),
    kind: z.literal('comparison'),
    caller: z.string(),
    label: z.string().nullable(),
    serviceVersion: z.string(),
    conventionsVersion: z.string(),
    policy: z.strictObject({ name: z.string(), hash: z.string() }).nullable(),
    datasetFingerprint: z.string().nullable(),
    requestDigest: hex64.meta({ description: 'SHA-256 of the canonical JSON (RFC 8785) of the request body exactly as sent; kept also when the body itself is not.' }),
    requestSummary: RequestSummary.nullable().meta({ description: 'null when only the request digest was kept.' }),
    request: jsonObject.nullable().meta({
      description: 'The request body exactly as sent (before any default is filled in), or null when only its digest was kept (AUDIT_REQUESTS=digest).',
    }),
    // A record written by an older service version keeps the shape that version
    // answered with, so the record always reads back, even after the schema moves on.
    result: z.union([ComparisonResult, jsonObject]).meta({
      description: 'The result exactly as POST /v1/comparisons answered it. Records written by an older serviceVersion keep that version\'s shape.',
    }),
    chain: ChainPosition,
    integrity: RecordIntegrity,
  })
  .meta({ id: 'StoredComparison' });

export const StoredSearch = StoredComparison.extend({
  kind: z.literal('search'),
  result: jsonObject.meta({ description: 'The result exactly as POST /v1/searches answered it.' }),
}).meta({ id: 'StoredSearch' });

/** One row of a listing: read from the narrow listing table, never from the stored request or result. */
function listItem(kind: 'comparison' | 'search', best: string, id: string) {
  return z
    .strictObject({
      id: z.string(),
      createdAt: z.string(),
      kind: z.literal(kind),
      caller: z.string(),
      label: z.string().nullable(),
      datasetFingerprint: z.string().nullable(),
      best: z.string().nullable().meta({ description: best }),
      seq: z.number().int(),
      hash: hex64,
    })
    .meta({ id });
}

function recordList(item: ReturnType<typeof listItem>, id: string) {
  return z
    .strictObject({
      records: z.array(item).meta({ description: 'Newest first (descending chain position).' }),
      unreadable: z
        .array(z.strictObject({ seq: z.number().int(), id: z.string().nullable() }))
        .meta({ description: 'Rows on this page that no longer read back as records (damaged in the database); run GET /v1/audit/verify. Normally empty.' }),
      nextCursor: z.string().nullable().meta({ description: 'Pass as cursor for the next, older page; null on the last page.' }),
    })
    .meta({ id });
}

export const ComparisonListItem = listItem('comparison', 'verdict.chosen: the best model under the request\'s rankBy.', 'ComparisonListItem');
export const ComparisonList = recordList(ComparisonListItem, 'ComparisonList');
export const SearchListItem = listItem('search', 'The name of models[0]: the best subset under conventions.rankBy.', 'SearchListItem');
export const SearchList = recordList(SearchListItem, 'SearchList');

export const VerifyReportSchema = z
  .strictObject({
    ok: z.boolean(),
    records: z.number().int().meta({ description: 'Records walked.' }),
    head: z
      .strictObject({ seq: z.number().int(), id: z.string(), hash: hex64 })
      .nullable()
      .meta({ description: 'The last readable record; null for an empty chain. Pin head.hash outside the database to detect a wholesale rewrite.' }),
    firstBroken: z
      .strictObject({
        seq: z.number().int(),
        id: z.string().nullable(),
        reason: z.enum(['unreadable', 'sequence_gap', 'prev_hash_mismatch', 'hash_mismatch', 'head_mismatch']),
      })
      .nullable()
      .meta({
        description:
          'The first record whose content (hash_mismatch, unreadable), order (sequence_gap) or link (prev_hash_mismatch, head_mismatch: newest records removed or added behind the store) is wrong; null when ok.',
      }),
  })
  .meta({ id: 'VerifyReport' });

const JsonLeaf = z.unknown().meta({ description: 'A JSON value (a number, string, boolean, null, or a whole entry for added/removed).' });

export const ReplayChange = z
  .strictObject({
    path: z.string().meta({ description: 'JSON Pointer (without the leading "/") into the stored result; into today\'s for an added entry.' }),
    change: z.enum(['value', 'added', 'removed']),
    nowPath: z.string().optional().meta({ description: 'Where the entry sits in today\'s result, when it moved (rankings are sorted by rank).' }),
    stored: JsonLeaf,
    now: JsonLeaf,
    absoluteChange: z.number().nullable().meta({ description: 'now − stored, for numbers.' }),
    relativeChange: z.number().nullable().meta({ description: '(now − stored) / |stored|, for numbers with stored ≠ 0.' }),
  })
  .meta({ id: 'ReplayChange' });

const VersionPair = z.strictObject({ stored: z.string(), now: z.string() });
const PolicyRefSchema = z.strictObject({ name: z.string(), hash: z.string() });

export const ReplayReport = z
  .strictObject({
    id: z.string(),
    replayedAt: z.string(),
    serviceVersion: VersionPair,
    conventionsVersion: VersionPair,
    policy: z.strictObject({ stored: PolicyRefSchema.nullable(), now: PolicyRefSchema }).meta({
      description: 'The team policy recorded with the comparison or search (null for records made before policies) and the one the replay ran under.',
    }),
    identical: z.boolean().meta({ description: 'Every value of the result is reproduced exactly.' }),
    valuesCompared: z.number().int(),
    changes: z.array(ReplayChange).meta({
      description: 'Every value that differs. Models, ranking entries, coefficients and cautions are matched by name, term or code, not by position.',
    }),
    summary: z.string(),
  })
  .meta({ id: 'ReplayReport' });

/** The stored record itself: every field the hash covers, plus prevHash and hash. */
export const RawRecord = z
  .looseObject({
    id: z.string(),
    seq: z.number().int(),
    kind: z.enum(['comparison', 'search']),
    prevHash: hex64,
    hash: hex64,
  })
  .meta({ id: 'RawRecord', description: 'An audit record exactly as stored and hashed.' });
