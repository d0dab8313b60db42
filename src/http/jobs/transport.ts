// How a job's request body crosses to a worker. postMessage copies by
// structured clone, which visits every element of a plain array: for columns
// of numbers that is tens of nanoseconds a value on the main thread, so a
// body of millions of numbers would hold the event loop for as long as the
// work it hands off. A numeric column therefore travels as a Float64Array
// (one memory copy) with a byte mask for its missing values, and is unpacked
// into the array the core expects on the worker's side. Text columns travel
// as they are. Each body is packed once, however many jobs carry it.

type Values = ReadonlyArray<number | string | null>;
type ColumnSet = Record<string, Values>;

interface PackedColumn {
  packedNumbers: Float64Array;
  /** 1 where the value is missing (null); null when none is. */
  missing: Uint8Array | null;
}

const PACKED = '__packedColumns';

function packColumn(values: Values): Values | PackedColumn {
  const first = values.find((v) => v !== null);
  if (typeof first !== 'number') return values;
  const numbers = new Float64Array(values.length);
  let missing: Uint8Array | null = null;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null) (missing ??= new Uint8Array(values.length))[i] = 1;
    else numbers[i] = v as number;
  }
  return { packedNumbers: numbers, missing };
}

function unpackColumn(column: Values | PackedColumn): Values {
  if (Array.isArray(column)) return column;
  const { packedNumbers, missing } = column as PackedColumn;
  const values = new Array<number | null>(packedNumbers.length);
  for (let i = 0; i < packedNumbers.length; i++) values[i] = missing && missing[i] ? null : packedNumbers[i];
  return values;
}

function mapColumns(columns: ColumnSet, each: (values: Values) => unknown): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [name, values] of Object.entries(columns)) out[name] = each(values);
  return out;
}

/** The places a request keeps columns: data.columns, and a comparison's options.predict.columns. */
function withColumns(body: Record<string, unknown>, each: (values: Values) => unknown): Record<string, unknown> {
  const data = body.data as { columns?: ColumnSet } | undefined;
  const options = body.options as { predict?: { columns: ColumnSet } } | undefined;
  const out: Record<string, unknown> = { ...body };
  if (data?.columns) out.data = { ...data, columns: mapColumns(data.columns, each) };
  if (options?.predict) out.options = { ...options, predict: { ...options.predict, columns: mapColumns(options.predict.columns, each) } };
  return out;
}

const packedBodies = new WeakMap<object, unknown>();

/** The job as it is posted to a worker: its body's numeric columns packed. */
export function forWorker(job: object): unknown {
  const body = (job as { body?: unknown }).body;
  if (!body || typeof body !== 'object') return job;
  let packed = packedBodies.get(body);
  if (!packed) {
    packed = { ...withColumns(body as Record<string, unknown>, packColumn), [PACKED]: true };
    packedBodies.set(body, packed);
  }
  return { ...job, body: packed };
}

/** The job as the worker runs it: the body as it was validated. */
export function fromMain(message: unknown): unknown {
  const job = message as { body?: Record<string, unknown> };
  if (!job.body || job.body[PACKED] !== true) return message;
  const { [PACKED]: _marker, ...body } = job.body;
  return { ...job, body: withColumns(body, (values) => unpackColumn(values as unknown as Values | PackedColumn)) };
}
