// Building blocks shared by the request schemas.
import { z } from 'zod';

export const ColumnName = z
  .string()
  .min(1, 'a column name cannot be empty')
  .max(200, 'a column name has at most 200 characters')
  .meta({ description: 'The name of a column of data.columns.' });

// zod 4's number() already refuses Infinity and NaN; the message says where they
// come from, since JSON.parse turns an overflowing literal such as 1e999 into Infinity.
// A range check chained on a FiniteNumber (a positive θ, λ within ±5) keeps a
// message of its own that names the range, not the finiteness.
export const FiniteNumber = z.number({
  error: (issue) => {
    if (issue.code === 'invalid_type') {
      return typeof issue.input === 'number' ? 'numbers must be finite (a JSON number beyond ±1.8e308 overflows to infinity)' : 'expected a number';
    }
    if (issue.code === 'too_small') return `must be ${issue.inclusive ? 'at least' : 'greater than'} ${String(issue.minimum)}`;
    if (issue.code === 'too_big') return `must be ${issue.inclusive ? 'at most' : 'less than'} ${String(issue.maximum)}`;
    return undefined;
  },
});

/**
 * A whole number in a query string, written in decimal digits only: Number()
 * and z.coerce would also read "0x10", "1e2", " 16" and "" (as 0).
 */
export function decimalQueryInteger(name: string, min: number, max: number) {
  const message = `${name} must be a whole number from ${min} to ${max}, written in decimal digits`;
  return z
    .string()
    .regex(/^[0-9]{1,15}$/, message)
    .transform(Number)
    .pipe(z.number().int().min(min, message).max(max, message));
}

export const Term = z
  .union([
    ColumnName,
    z.discriminatedUnion('kind', [
      z.strictObject({
        kind: z.literal('power'),
        of: ColumnName,
        degree: z.number().int().min(2).max(20),
      }),
      z.strictObject({
        kind: z.literal('product'),
        of: z.array(ColumnName).min(2, 'a product needs at least two columns').max(6),
      }),
      z.strictObject({
        kind: z.literal('transform'),
        of: ColumnName,
        fn: z.enum(['log', 'sqrt', 'reciprocal']),
      }),
      z.strictObject({
        kind: z.literal('factor'),
        of: ColumnName,
        reference: z.string().max(200).optional(),
      }),
    ]),
  ])
  .meta({
    id: 'Term',
    description:
      'A column name (numeric: one column; text: a factor), or a power, product, transform or factor of columns.',
  });

export const criterionNames = ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2', 'qaic', 'qaicc'] as const;
export const Criterion = z.enum(criterionNames).meta({
  id: 'Criterion',
  description: 'A ranking criterion. qaic and qaicc exist only in a comparison with options.overdispersion (they divide the log-likelihood by ĉ); naming them without it is refused (422).',
});
