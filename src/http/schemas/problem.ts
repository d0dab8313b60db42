// RFC 9457 problem details as the OpenAPI document shows them.
import { z } from 'zod';

export const ProblemSchema = z
  .looseObject({
    type: z.string(),
    title: z.string(),
    status: z.number().int(),
    detail: z.string(),
    errors: z
      .array(
        z.looseObject({
          path: z.string().meta({ description: 'JSON Pointer into the request, without the leading slash.' }),
          message: z.string(),
          code: z.string().optional(),
        }),
      )
      .optional(),
  })
  .meta({ id: 'Problem', description: 'RFC 9457 problem details (application/problem+json).' });
