// GET /v1/comparisons/{id}/chart.svg and GET /v1/comparisons/{id}/report: a
// stored comparison drawn for a dashboard and written up for a person. Both
// read the record as GET /v1/comparisons/{id} does (same 400, 404, 500, 503)
// and hand it to the pure renderers of src/render.
//
// Caching: a stored record never changes (append-only, hash-chained) and the
// renderers are deterministic, so a reply may be kept for a year without
// asking again (RFC 9111 max-age; RFC 8246 immutable). A copy kept while the
// record was intact stays true to it, even if the row is edited later; a
// record that fails its integrity check is drawn with that warning and never
// cached (no-store), so repairing the database is seen at once. It is `public` only
// when the request carried no credentials (the service runs open): with an API
// key it is `private`, because `public` would let a shared cache serve a
// read-role picture to anyone (RFC 9111 §3.5). A new service version may draw
// the same record differently; the strong ETag (a digest of the bytes) lets a
// client that revalidates anyway learn that cheaply (304).
import { createHash } from 'node:crypto';
import type { FastifyReply, FastifyRequest, FastifySchemaCompiler } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { AuditStore, RecordKind, StoredRecord } from '../../audit/store.ts';
import {
  chartContentSecurityPolicy,
  criterionNames,
  heightRange,
  parseChartOptions,
  REPORT_ROW_LIMITS,
  renderChartSvg,
  renderReportHtml,
  reportContentSecurityPolicy,
  sizePresets,
  storedComparisonView,
  widthRange,
  type ChartOptionIssue,
  type ChartOptions,
  type StoredComparisonView,
} from '../../render/index.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { ProblemSchema } from '../schemas/problem.ts';
import { RecordParams } from '../schemas/record.ts';
import { zodValidatorCompiler } from '../validation.ts';
import type { RecordIntegrity } from '../../audit/integrity.ts';
import { answeredResult, readRecord } from './records.ts';

export const SVG_CONTENT_TYPE = 'image/svg+xml; charset=utf-8';
export const HTML_CONTENT_TYPE = 'text/html; charset=utf-8';
const IMMUTABLE = 'max-age=31536000, immutable';

/**
 * The HTTP header adds what a <meta> policy cannot carry: frame-ancestors,
 * matching helmet's X-Frame-Options: SAMEORIGIN for every other reply.
 */
export const chartPolicyHeader = `${chartContentSecurityPolicy}; frame-ancestors 'self'`;
export const reportPolicyHeader = `${reportContentSecurityPolicy}; frame-ancestors 'self'`;

// The options, for the OpenAPI document. They are checked by the renderers'
// own parseChartOptions (which also knows which criteria the record ranked),
// so the route lets the query through unvalidated and validates the id as usual.
const presetNames = Object.keys(sizePresets) as [string, ...string[]];
export const PictureQuery = z.strictObject({
  criterion: z.enum(criterionNames).optional().meta({
    description: 'The ranking to draw; one the comparison ranked (qaic and qaicc only with options.overdispersion, drawn against the AIC reference lines). Default: the criterion the comparison ranked by (verdict.rankBy).',
  }),
  size: z.enum(presetNames).optional().meta({
    description: `A named size: ${Object.entries(sizePresets).map(([k, v]) => `${k} ${v.width}${v.height === null ? ' wide' : `×${v.height}`}`).join(', ')}. Default panel.`,
  }),
  width: z.int().min(widthRange.min).max(widthRange.max).optional().meta({ description: `Width in pixels, ${widthRange.min}..${widthRange.max}; overrides the size's.` }),
  height: z.int().min(heightRange.min).max(heightRange.max).optional().meta({
    description: `Height in pixels, ${heightRange.min}..${heightRange.max}; default: as tall as the models need. Rows shrink to fit.`,
  }),
});

// Typed loosely: fastify types a route-level compiler by that route's inferred schema.
export const paramsOnly: FastifySchemaCompiler<any> = (route) =>
  route.httpPart === 'querystring' ? (data) => ({ value: data }) : zodValidatorCompiler(route);

const problemResponses = { 400: ProblemSchema, 404: ProblemSchema, 422: ProblemSchema, 500: ProblemSchema, 503: ProblemSchema };
const notModified = z.null().meta({ description: 'Not modified: the copy the client holds (If-None-Match) is current. No body.' });

/** The answers of every chart.svg and every report, a comparison's or a search's. */
export const chartResponses = {
  200: { description: 'The chart as SVG: no scripts and no external references; its title and desc say the ranking in words.', content: { 'image/svg+xml': { schema: z.string() } } },
  304: notModified,
  ...problemResponses,
};
export const reportResponses = {
  200: { description: 'The report (HTML5, UTF-8, printable).', content: { 'text/html': { schema: z.string() } } },
  304: notModified,
  ...problemResponses,
};

function optionsProblem(reply: FastifyReply, issues: ChartOptionIssue[]): FastifyReply {
  // A record without any ranking is not the caller's fault: nothing in the query could fix it.
  if (issues.every((i) => i.code === 'no_ranking')) {
    return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(
      problem(422, problemTypes.cannotCompute, 'Nothing to draw', issues[0].message, { errors: issues }));
  }
  const detail = issues.length === 1 ? `${issues[0].path}: ${issues[0].message}` : `${issues.length} problems with the options; the first: ${issues[0].path}: ${issues[0].message}`;
  return reply.code(400).type(PROBLEM_CONTENT_TYPE).send(
    problem(400, problemTypes.invalidRequest, 'The request does not match the schema', detail, { errors: issues }));
}

/**
 * The record read as `kind` (integrity checked), turned into its view, and the
 * chart options checked against the rankings that view draws; or null with the
 * problem already sent.
 */
export async function recordAndOptions<V>(
  store: AuditStore,
  request: { params: { id: string }; query: unknown },
  reply: FastifyReply,
  kind: RecordKind,
  viewOf: (record: StoredRecord, result: Record<string, unknown>, integrity: RecordIntegrity) => V,
  drawn: (view: V) => StoredComparisonView,
): Promise<{ view: V; options: ChartOptions; integrity: RecordIntegrity } | null> {
  const read = await readRecord(store, request.params.id, reply, kind);
  if (!read) return null;
  const view = viewOf(read.record, answeredResult(read.record), read.integrity);
  const parsed = parseChartOptions((request.query ?? {}) as Record<string, unknown>, drawn(view));
  if (!parsed.ok) {
    optionsProblem(reply, parsed.issues);
    return null;
  }
  return { view, options: parsed.options, integrity: read.integrity };
}

const comparisonPicture = (store: AuditStore, request: { params: { id: string }; query: unknown }, reply: FastifyReply) =>
  recordAndOptions(store, request, reply, 'comparison', storedComparisonView, (view) => view);

export function sendPicture(request: FastifyRequest, reply: FastifyReply, body: string, contentType: string, policy: string, intact: boolean): FastifyReply {
  const etag = `"${createHash('sha256').update(body).digest('base64url').slice(0, 32)}"`;
  const scope = request.headers.authorization === undefined ? 'public' : 'private';
  reply.header('cache-control', intact ? `${scope}, ${IMMUTABLE}` : 'no-store').header('etag', etag).header('content-security-policy', policy);
  const held = request.headers['if-none-match'];
  if (typeof held === 'string' && held.split(',').some((tag) => tag.trim().replace(/^W\//, '') === etag)) {
    return reply.code(304).send();
  }
  return reply.code(200).type(contentType).send(body);
}

export const pictureRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/v1/comparisons/:id/chart.svg', {
    validatorCompiler: paramsOnly,
    schema: {
      tags: ['comparisons'],
      summary: 'A picture of one ranking of a stored comparison, as SVG, for a dashboard to embed',
      description: [
        'One row per model: its Δ from the best as a bar against dashed reference lines (AIC, AICc, HQC: Δ 2, 4, 7, 10; BIC: 2, 6, 10), its weight beside it, and a strip naming the model each criterion of the verdict prefers.',
        'Every model has a key (A, B, …, in the record\'s model order) beside its name in its row and its strip box; where a name does not fit, it is shortened and a note under the chart spells out every key with its full name.',
        'The words beside the bars are the team policy\'s band for each Δ, as in the JSON (rankings.*.band), except the best model (Δ = 0), which reads "best". They stand after the value, inside a long bar, or on a line under the bar; where a fixed height leaves no room they are left out and a note says how many. The SVG carries a <title> and a <desc> with the whole ranking in words, and every value as text.',
        'A record that fails its integrity check on reading (see `integrity` of GET /v1/comparisons/{id}) is drawn with a warning across its top and data-integrity="failed" on the root, and is sent with Cache-Control: no-store.',
        'The bytes depend only on the record and the options, so the reply is cacheable for a year (public without credentials, private with an API key) and carries a strong ETag.',
        'Criteria rank the candidates; they do not validate a model. Defer to domain review and local rules.',
      ].join('\n\n'),
      params: RecordParams,
      querystring: PictureQuery,
      response: chartResponses,
    },
  }, async (request, reply) => {
    const found = await comparisonPicture(store, request, reply);
    if (!found) return reply;
    return sendPicture(request, reply, renderChartSvg(found.view, found.options), SVG_CONTENT_TYPE, chartPolicyHeader, found.integrity.ok);
  });

  app.get('/v1/comparisons/:id/report', {
    validatorCompiler: paramsOnly,
    schema: {
      tags: ['comparisons'],
      summary: 'A self-contained HTML page of a stored comparison, for a person to read or print',
      description: [
        'The integrity check made on reading the record, first (a failure in a bordered alert); what was compared and who came first, in one sentence; the data set and conventions in words; the chart; every ranking with the team policy\'s words for each Δ; the models (criteria, and fit with σ, PRESS and leave-one-out) and their coefficients; predictions, nested tests, averaged estimates and diagnostics when the record has them; the cautions, each said once; and the record\'s place in the audit chain with how to check it.',
        'No scripts and nothing loaded from anywhere: the style sheet and the chart are inline and the Content-Security-Policy forbids everything else. The query options choose the chart drawn in the page, as for chart.svg.',
        `Long tables are cut short so the page stays readable and bounded in size: the first ${REPORT_ROW_LIMITS.coefficients} coefficients per model, ${REPORT_ROW_LIMITS.averagedTerms} averaged terms and ${REPORT_ROW_LIMITS.averagedPredictions} averaged predictions, each with a note saying how many were left out; GET /v1/comparisons/{id} holds them all.`,
        'Cacheable for a year, like chart.svg; never cached when the record fails its integrity check.',
      ].join('\n\n'),
      params: RecordParams,
      querystring: PictureQuery,
      response: reportResponses,
    },
  }, async (request, reply) => {
    const found = await comparisonPicture(store, request, reply);
    if (!found) return reply;
    const html = renderReportHtml(found.view, { chartSvg: renderChartSvg(found.view, found.options) });
    return sendPicture(request, reply, html, HTML_CONTENT_TYPE, reportPolicyHeader, found.integrity.ok);
  });
};
