// Versioned schema for the PostgreSQL store. Append new versions; never edit a
// version that has shipped.
import type { Migration } from './sqlite.ts';

export const postgresMigrations: Migration[] = [
  {
    version: 1,
    name: 'audit records and chain head',
    sql: `
      CREATE TABLE audit_records (
        seq BIGINT PRIMARY KEY,
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
      CREATE TABLE audit_head (
        singleton INTEGER PRIMARY KEY CHECK (singleton = 1),
        seq BIGINT NOT NULL,
        record_id TEXT,
        hash TEXT NOT NULL
      );
      INSERT INTO audit_head (singleton, seq, record_id, hash) VALUES (1, 0, NULL, '${'0'.repeat(64)}');
      CREATE TABLE audit_probe (singleton INTEGER PRIMARY KEY CHECK (singleton = 1), at TEXT NOT NULL);
    `,
  },
];
