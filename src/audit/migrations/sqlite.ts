// Versioned schema for the SQLite store. Append new versions; never edit a
// version that has shipped (its effect is already in people's files).
export interface Migration {
  version: number;
  name: string;
  sql: string;
}

export const sqliteMigrations: Migration[] = [
  {
    version: 1,
    name: 'audit records and chain head',
    sql: `
      CREATE TABLE audit_records (
        seq INTEGER PRIMARY KEY,
        id TEXT NOT NULL UNIQUE,
        created_at TEXT NOT NULL,
        kind TEXT NOT NULL,
        caller TEXT NOT NULL,
        label TEXT,
        service_version TEXT NOT NULL,
        conventions_version TEXT NOT NULL,
        policy_name TEXT,
        policy_hash TEXT,
        dataset_fingerprint TEXT,
        request_digest TEXT NOT NULL,
        request TEXT,
        result TEXT NOT NULL,
        prev_hash TEXT NOT NULL,
        hash TEXT NOT NULL
      );
      CREATE INDEX audit_records_fingerprint ON audit_records (dataset_fingerprint, seq);
      CREATE INDEX audit_records_caller ON audit_records (caller, seq);
      CREATE INDEX audit_records_created_at ON audit_records (created_at);
      -- The head is kept apart from the records so that removing the newest
      -- records is detected too, not only gaps inside the chain.
      CREATE TABLE audit_head (
        singleton INTEGER PRIMARY KEY CHECK (singleton = 1),
        seq INTEGER NOT NULL,
        record_id TEXT,
        hash TEXT NOT NULL
      );
      INSERT INTO audit_head (singleton, seq, record_id, hash) VALUES (1, 0, NULL, '${'0'.repeat(64)}');
      -- Written by the readiness probe after a failed append, to learn whether writes work again.
      CREATE TABLE audit_probe (singleton INTEGER PRIMARY KEY CHECK (singleton = 1), at TEXT NOT NULL);
    `,
  },
  {
    version: 2,
    name: 'listing columns kept apart from the record bodies',
    // The listing shows the best model (inside result) and the hash, which
    // sits after request and result in the row: SQLite reaches it only by
    // walking those columns' overflow pages (~80 ms per 50 MB record), so a
    // page of large records was slow to list. This narrow table answers both.
    // Filled here for records written before, and by every append after.
    sql: `
      CREATE TABLE audit_listing (
        seq INTEGER PRIMARY KEY,
        best TEXT,
        hash TEXT NOT NULL
      );
      INSERT INTO audit_listing (seq, best, hash)
        SELECT seq,
          CASE WHEN json_valid(result) THEN
            CASE
              WHEN kind = 'comparison' AND json_type(result, '$.verdict.chosen') = 'text' THEN json_extract(result, '$.verdict.chosen')
              WHEN kind = 'search' AND json_type(result, '$.models[0].name') = 'text' THEN json_extract(result, '$.models[0].name')
            END
          END,
          hash
        FROM audit_records;
    `,
  },
];
