// GET /v1/comparisons/{id}/life.svg: the life-data picture of a stored
// comparison with life models — the nonparametric estimate of the fraction
// failed against each fitted distribution — drawn from the numbers stored
// with the result when the comparison ran (lifePicture). Nothing is refitted
// here: reading, checking and drawing only. Caching, ETag and integrity
// handling are those of chart.svg (pictures.ts).
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import type { AuditStore } from '../../audit/store.ts';
import { chartContentSecurityPolicy, renderLifeChartSvg, sizePresets, storedLifePicture, widthRange, heightRange } from '../../render/index.ts';
import { problem, problemTypes, PROBLEM_CONTENT_TYPE } from '../problems.ts';
import { RecordParams } from '../schemas/record.ts';
import { answeredResult, readRecord } from './records.ts';
import { chartResponses, sendPicture, SVG_CONTENT_TYPE } from './pictures.ts';

const policy = `${chartContentSecurityPolicy}; frame-ancestors 'self'`;
const presetNames = Object.keys(sizePresets) as [keyof typeof sizePresets, ...(keyof typeof sizePresets)[]];
/** Without a size, the life picture's own proportions. */
const DEFAULT = { width: 760, height: 460 };

export const LifePictureQuery = z.strictObject({
  size: z.enum(presetNames).optional().meta({ description: 'A named width, as for chart.svg (tile is also 280 high). Default 760×460.' }),
  width: z.coerce.number().int().min(widthRange.min).max(widthRange.max).optional().meta({ description: `Width in pixels, ${widthRange.min}..${widthRange.max}; overrides the size's.` }),
  height: z.coerce.number().int().min(heightRange.min).max(heightRange.max).optional().meta({ description: `Height in pixels, ${heightRange.min}..${heightRange.max}.` }),
});

export const lifePictureRoutes: FastifyPluginAsyncZod<{ store: AuditStore }> = async (app, { store }) => {
  app.get('/v1/comparisons/:id/life.svg', {
    schema: {
      tags: ['comparisons'],
      summary: 'The life-data picture of a stored comparison with life models, as SVG',
      description: [
        'The nonparametric estimate of the fraction failed F(t) — Kaplan–Meier with its band when every row is exact or right-censored, Turnbull\'s estimate with a shaded box wherever it is not determined otherwise — against each fitted life distribution\'s F(t), on a log-time axis when every time is positive.',
        'Drawn only from the numbers stored with the comparison (lifePicture of GET /v1/comparisons/{id}): nothing is refitted. A model with terms (an accelerated-failure-time model) is drawn as F(t | x) averaged over the comparison\'s rows, and its legend entry says so.',
        'A comparison without life models, one whose picture was over its budget (caution life_picture_skipped), or one stored before the picture existed has none: 422.',
        'Caching, the ETag and the integrity handling are those of chart.svg.',
        'Like the criteria, the picture compares models; it does not validate one. A life model for a safety-relevant decision needs domain review and local rules.',
      ].join('\n\n'),
      params: RecordParams,
      querystring: LifePictureQuery,
      response: chartResponses,
    },
  }, async (request, reply) => {
    const read = await readRecord(store, request.params.id, reply, 'comparison');
    if (!read) return reply;
    const picture = storedLifePicture(answeredResult(read.record));
    if (!picture) {
      return reply.code(422).type(PROBLEM_CONTENT_TYPE).send(problem(422, problemTypes.cannotCompute, 'Nothing to draw',
        'This comparison has no life-data picture: it has no life models (candidates with a distribution), its picture was over the picture\'s budget (the caution life_picture_skipped says so), or it was stored before the picture existed.'));
    }
    const preset = request.query.size ? sizePresets[request.query.size] : null;
    const width = request.query.width ?? preset?.width ?? DEFAULT.width;
    const height = request.query.height ?? preset?.height ?? Math.round(width * (DEFAULT.height / DEFAULT.width));
    const label = typeof read.record.label === 'string' && read.record.label.trim() !== '' ? read.record.label : `Comparison ${read.record.id}`;
    const svg = renderLifeChartSvg({ title: `${label}: fraction failed against the fitted life models`, picture, width, height });
    return sendPicture(request, reply, svg, SVG_CONTENT_TYPE, policy, read.integrity.ok);
  });
};
