// Worked examples for every operation that takes a body, drawn from the demo
// scenario (src/demo-scenario.ts: tile shrinkage, invented), so "Try it out"
// in /docs sends a request the service answers with 200, not a placeholder
// generated from the schema. test/http/docs-examples.test.ts posts each one.
//
// They are added to the finished document rather than to the route schemas:
// the summaries route reads its body as a raw stream (no body schema to hang
// an example on), and one place keeps every example in view.
import { demoColumns, demoComparison } from '../demo-scenario.ts';
import { soakComparison } from '../demo-soak.ts';

/** Rows of the demo campaign in the examples: enough for every candidate, short enough to read. */
const EXAMPLE_ROWS = 24;

export const comparisonExample = demoComparison(EXAMPLE_ROWS);

/** A candidate written as an expression (a mechanistic model) beside polynomials, from the demo's soak trial. */
export const expressionComparisonExample = soakComparison();

export const searchExample = {
  label: 'tile shrinkage: which kiln settings matter? (demo data)',
  data: { columns: demoColumns(EXAMPLE_ROWS) },
  response: 'shrinkage',
  pool: ['peakTemp', { kind: 'power', of: 'peakTemp', degree: 2 }, 'moisture', 'kiln', 'holdMinutes'],
  hierarchy: true,
  rankBy: 'aicc',
  top: 5,
};

/** The numeric columns of the demo rows, for POST /v1/summaries (a factor such as kiln is not summarised). */
export const summaryColumns = ['peakTemp', 'holdMinutes', 'moisture', 'shrinkage'] as const;

function summaryRows(): Record<string, number | null>[] {
  const columns = demoColumns(EXAMPLE_ROWS);
  return columns.shrinkage.map((_, i) => Object.fromEntries(summaryColumns.map((c) => [c, columns[c][i]])));
}

export const summaryNdjsonExample = `${summaryRows().map((row) => JSON.stringify(row)).join('\n')}\n`;
export const summaryCsvExample = `${summaryColumns.join(',')}\n${summaryRows().map((row) => summaryColumns.map((c) => row[c] ?? '').join(',')).join('\n')}\n`;

type Media = { schema?: unknown; example?: unknown; examples?: Record<string, { summary: string; value: unknown }> };
type Operation = { requestBody?: { required?: boolean; description?: string; content: Record<string, Media> }; parameters?: { name: string; in: string; example?: unknown }[] };
type Doc = { paths?: Record<string, Record<string, Operation>> };

function jsonExample(operation: Operation | undefined, summary: string, value: unknown, more: Record<string, { summary: string; value: unknown }> = {}): void {
  const media = operation?.requestBody?.content?.['application/json'];
  if (media) media.examples = { demo: { summary, value }, ...more };
}

/** The document with a worked example on every operation that takes a body. */
export function attachExamples<T>(document: T): T {
  const paths = (document as Doc).paths ?? {};
  jsonExample(paths['/v1/comparisons']?.post, 'Tile shrinkage: five candidate models on 24 firings (demo data)', comparisonExample, {
    expression: {
      summary: 'Tile shrinkage against soak time: a mechanistic approach to a plateau, written as an expression, beside two polynomials (demo data)',
      value: expressionComparisonExample,
    },
  });
  jsonExample(paths['/v1/searches']?.post, 'Tile shrinkage: every subset of five kiln settings (demo data)', searchExample);
  const summaries = paths['/v1/summaries']?.post;
  if (summaries) {
    summaries.requestBody = {
      required: true,
      description: 'The rows, one per line: NDJSON objects, or CSV with a header row. Read as a stream, never held whole.',
      content: {
        'application/x-ndjson': { schema: { type: 'string' }, examples: { demo: { summary: '24 firings of the demo campaign as NDJSON', value: summaryNdjsonExample } } },
        'text/csv': { schema: { type: 'string' }, examples: { demo: { summary: '24 firings of the demo campaign as CSV', value: summaryCsvExample } } },
      },
    };
    const columns = summaries.parameters?.find((p) => p.in === 'query' && p.name === 'columns');
    if (columns) columns.example = summaryColumns.join(',');
  }
  return document;
}
