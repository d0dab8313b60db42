// A JSON key as words for a person: "parameterCount" → "parameter count",
// "rankByReason" → "rank by reason". The pages never show a key as it is
// spelled in the JSON; names that read better otherwise are given outright
// where they are used (report-conventions.ts).
export function keyInWords(key: string): string {
  return key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .replace(/\b([A-Z])([a-z])/g, (_, first: string, next: string) => first.toLowerCase() + next)
    .trim();
}
