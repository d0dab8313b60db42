// POST /v1/comparisons request: the single source of its validation, its
// TypeScript type and its part of the OpenAPI document.
import { z } from 'zod';
import { ColumnName, FiniteNumber, Term } from './common.ts';

export const criterionNames = ['aicc', 'aic', 'bic', 'hqc', 'adjustedR2'] as const;
export const Criterion = z.enum(criterionNames).meta({ id: 'Criterion' });

const ColumnValuesSchema = z
  .array(
    z.union([FiniteNumber, z.string().max(200), z.null()], {
      error: (issue) =>
        typeof issue.input === 'number'
          ? 'numbers must be finite (a JSON number beyond ±1.8e308 overflows to infinity)'
          : typeof issue.input === 'string'
            ? 'a text value has at most 200 characters'
            : 'each value is a number, a string (categorical) or null (missing)',
    }),
  )
  .max(5_000_000)
  .superRefine((values, ctx) => {
    // One column is one kind of measurement: numbers and text in one column is a
    // data-entry mistake, not a factor.
    let sawNumber = -1;
    let sawText = -1;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (typeof v === 'number' && sawNumber < 0) sawNumber = i;
      else if (typeof v === 'string' && sawText < 0) sawText = i;
      if (sawNumber >= 0 && sawText >= 0) {
        ctx.addIssue({
          code: 'custom',
          path: [Math.max(sawNumber, sawText)],
          message: `a column holds numbers or text, not both (row ${sawNumber} is a number, row ${sawText} is text)`,
        });
        return;
      }
    }
  });

export const DataSchema = z
  .strictObject({
    columns: z
      .record(ColumnName, ColumnValuesSchema)
      .superRefine((columns, ctx) => {
        const names = Object.keys(columns);
        if (names.length === 0) {
          ctx.addIssue({ code: 'custom', message: 'data.columns needs at least one column' });
          return;
        }
        const length = columns[names[0]].length;
        for (const name of names) {
          if (columns[name].length !== length) {
            ctx.addIssue({
              code: 'custom',
              path: [name],
              message: `all columns must have the same length: "${names[0]}" has ${length} values, "${name}" has ${columns[name].length}`,
            });
          }
        }
      })
      .meta({ description: 'Equal-length arrays: numbers, strings (categorical) or null (missing).' }),
  })
  .meta({ id: 'Data' });

export const FittedCandidate = z
  .strictObject({
    name: z.string().min(1).max(200),
    terms: z.array(Term).max(200),
    intercept: z.boolean().default(true),
  })
  .meta({ id: 'FittedCandidate', description: 'A model the service fits by least squares.' });

export const ComparisonOptions = z
  .strictObject({
    rankBy: Criterion.default('aicc'),
    confidenceLevel: z.number().gt(0).lt(1).default(0.95),
  })
  .meta({ id: 'ComparisonOptions' });

export const ComparisonRequest = z
  .strictObject({
    data: DataSchema,
    response: ColumnName,
    weights: ColumnName.nullable().optional(),
    candidates: z.array(FittedCandidate).min(1, 'at least one candidate is needed').max(200),
    options: ComparisonOptions.default({ rankBy: 'aicc', confidenceLevel: 0.95 }),
    label: z.string().max(1000).optional(),
  })
  .superRefine((request, ctx) => {
    const seen = new Map<string, number>();
    request.candidates.forEach((candidate, index) => {
      const earlier = seen.get(candidate.name);
      if (earlier !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['candidates', index, 'name'],
          message: `candidate names must be unique: "${candidate.name}" is also candidate ${earlier}`,
        });
      } else seen.set(candidate.name, index);
    });
  })
  .meta({ id: 'ComparisonRequest' });

export type ComparisonRequest = z.output<typeof ComparisonRequest>;
