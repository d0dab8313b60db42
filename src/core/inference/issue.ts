// Problems found by the statistics of "after the ranking" are reported as
// data, never thrown: a code the caller can branch on, plain words, and the
// facts that led to it.
export interface StatisticsIssue {
  code: string;
  message: string;
  facts: Record<string, string | number | boolean | null>;
}
