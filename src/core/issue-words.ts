// Words shared by the issue messages of every concern.

/** Values quoted as JSON and joined with commas: "a", "b". */
export function quoteList(values: string[]): string {
  return values.map((v) => JSON.stringify(v)).join(', ');
}
