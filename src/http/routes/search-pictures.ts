// GET /v1/searches/{id}/chart.svg and GET /v1/searches/{id}/report: a stored
// search drawn and written up, read, checked, cached and refused exactly as a
// comparison's pictures are (pictures.ts says how and why).
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { AuditStore } from '../../audit/store.ts';
import { renderChartSvg, renderSearchReportHtml, SEARCH_REPORT_ROW_LIMITS, storedSearchView } from '../../render/index.ts';
import { RecordParams } from '../schemas/record.ts';
import {
  chartPolicyHeader, chartResponses, HTML_CONTENT_TYPE, paramsOnly, PictureQuery, recordAndOptions, reportPolicyHeader, reportResponses, sendPicture, SVG_CONTENT_TYPE,
} from './pictures.ts';

const searchPicture = (store: AuditStore, request: { params: { id: string }; query: unknown }, reply: Parameters<typeof recordAndOptions>[2]) =>
  recordAndOptions(store, request, reply, 'search', storedSearchView, (view) => view.ranking);

const caution = 'Criteria rank the subsets; they do not validate a model. Defer to domain review and local rules.';

export const searchPictureRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/v1/searches/:id/chart.svg', {
    validatorCompiler: paramsOnly,
    schema: {
      tags: ['searches'],
      summary: 'A picture of the best subsets of a stored search, as SVG, for a dashboard to embed',
      description: [
        'One row per listed subset, best first: its Δ from the best by the criterion the search ranked by (conventions.rankBy, the only criterion it can draw) against the dashed reference lines, and its weight beside it. Δ and weights are the search\'s own, over every subset it scored, so the weights drawn may sum to less than 100%.',
        'Keys, shortened names, band wording, the integrity warning, the <title> and <desc>, and caching are as for GET /v1/comparisons/{id}/chart.svg.',
        caution,
      ].join('\n\n'),
      params: RecordParams,
      querystring: PictureQuery,
      response: chartResponses,
    },
  }, async (request, reply) => {
    const found = await searchPicture(store, request, reply);
    if (!found) return reply;
    return sendPicture(request, reply, renderChartSvg(found.view.ranking, found.options), SVG_CONTENT_TYPE, chartPolicyHeader, found.integrity.ok);
  });

  app.get('/v1/searches/:id/report', {
    validatorCompiler: paramsOnly,
    schema: {
      tags: ['searches'],
      summary: 'A self-contained HTML page of a stored search, for a person to read or print',
      description: [
        'The integrity check made on reading the record, first; what was searched and which subset came first, in one sentence; the method, criterion, response scale, whether the list is proven, what was passed over and the budget; the chart; the best subsets with Δ, weight and evidence ratio; the importance of each pool term; the cautions; and the record\'s place in the audit chain.',
        `Tables are bounded: the first ${SEARCH_REPORT_ROW_LIMITS.models} subsets and ${SEARCH_REPORT_ROW_LIMITS.importance} pool terms, with a note saying how many were left out. No scripts and nothing loaded from anywhere; cacheable for a year, never cached when the record fails its integrity check.`,
        caution,
      ].join('\n\n'),
      params: RecordParams,
      querystring: PictureQuery,
      response: reportResponses,
    },
  }, async (request, reply) => {
    const found = await searchPicture(store, request, reply);
    if (!found) return reply;
    const html = renderSearchReportHtml(found.view, { chartSvg: renderChartSvg(found.view.ranking, found.options) });
    return sendPicture(request, reply, html, HTML_CONTENT_TYPE, reportPolicyHeader, found.integrity.ok);
  });
};
