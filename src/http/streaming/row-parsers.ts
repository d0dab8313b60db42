// Rows of a streamed body as numbers of the listed columns. NDJSON: one JSON
// object per line, every listed column a key, its value a finite number or
// null (missing). CSV (RFC 4180, one record per line): a header row naming
// the columns, then fields; an empty field is missing. A missing value drops
// the row (common rows); anything else not a number is a malformed line.
import { RowError } from './row-error.ts';

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Fills `out` (one slot per listed column, then the weight) and returns true, or false for a row with a missing value. */
export type RowReader = (line: string, lineNumber: number, out: Float64Array) => boolean;

const describe = (v: unknown) => (typeof v === 'string' ? `the string ${JSON.stringify(v.slice(0, 40))}` : Array.isArray(v) ? 'an array' : typeof v === 'object' ? 'an object' : String(v));

export function ndjsonReader(columns: readonly string[]): RowReader {
  return (line, lineNumber, out) => {
    let row: unknown;
    try {
      row = JSON.parse(line);
    } catch (error) {
      throw new RowError(lineNumber, `not valid JSON (${error instanceof Error ? error.message : String(error)})`);
    }
    if (row === null || typeof row !== 'object' || Array.isArray(row)) throw new RowError(lineNumber, 'each line must be one JSON object of column: value');
    const record = row as Record<string, unknown>;
    let complete = true;
    for (let j = 0; j < columns.length; j++) {
      const name = columns[j];
      if (!Object.prototype.hasOwnProperty.call(record, name)) throw new RowError(lineNumber, `no key ${JSON.stringify(name)}`);
      const v = record[name];
      if (v === null) complete = false;
      else if (typeof v === 'number' && Number.isFinite(v)) out[j] = v;
      else throw new RowError(lineNumber, `${JSON.stringify(name)} is ${describe(v)}, not a number`);
    }
    return complete;
  };
}

/** Splits one CSV record: commas, fields optionally in double quotes with "" for a quote. */
export function csvFields(line: string, lineNumber: number): string[] {
  const fields: string[] = [];
  let i = 0;
  for (;;) {
    if (line[i] === '"') {
      let value = '';
      i++;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q < 0) throw new RowError(lineNumber, 'a quoted field is not closed (fields cannot span lines)');
        value += line.slice(i, q);
        if (line[q + 1] === '"') {
          value += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      fields.push(value);
      if (i < line.length && line[i] !== ',') throw new RowError(lineNumber, `text after a closing quote in field ${fields.length}`);
    } else {
      const comma = line.indexOf(',', i);
      fields.push(line.slice(i, comma < 0 ? line.length : comma));
      i = comma < 0 ? line.length : comma;
    }
    if (i >= line.length) return fields;
    i++; // the comma
    if (i === line.length) {
      fields.push('');
      return fields;
    }
  }
}

/** The reader of the data rows, once the header (line 1) has named the columns. */
export function csvReader(header: string, columns: readonly string[]): RowReader {
  const names = csvFields(header, 1).map((s) => s.trim());
  const positions = columns.map((c) => {
    const at = names.indexOf(c);
    if (at < 0) throw new RowError(1, `the header has no column ${JSON.stringify(c)} (it has ${names.slice(0, 20).map((n) => JSON.stringify(n)).join(', ')})`);
    return at;
  });
  return (line, lineNumber, out) => {
    const fields = line.includes('"') ? csvFields(line, lineNumber) : line.split(',');
    if (fields.length !== names.length) throw new RowError(lineNumber, `${fields.length} fields, but the header names ${names.length}`);
    let complete = true;
    for (let j = 0; j < positions.length; j++) {
      const text = fields[positions[j]].trim();
      if (text === '') {
        complete = false;
        continue;
      }
      // Decimal notation only: Number() would also read 0x10, 0b101 and 0o7.
      const v = DECIMAL.test(text.trim()) ? Number(text) : NaN;
      if (!Number.isFinite(v)) throw new RowError(lineNumber, `${JSON.stringify(columns[j])} is ${JSON.stringify(text.slice(0, 40))}, not a finite number`);
      out[j] = v;
    }
    return complete;
  };
}
