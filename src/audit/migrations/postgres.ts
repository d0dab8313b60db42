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
  {
    version: 2,
    name: 'listing columns kept apart from the record bodies',
    // See the SQLite migration of the same version. A result that is not JSON
    // (a damaged row) lists with no best model rather than stopping the
    // migration, so the cast is guarded by a temporary function.
    sql: `
      CREATE TABLE audit_listing (
        seq BIGINT PRIMARY KEY,
        best TEXT,
        hash TEXT NOT NULL
      );
      CREATE FUNCTION pg_temp.parsimetry_best(kind TEXT, result TEXT) RETURNS TEXT LANGUAGE plpgsql AS $fn$
      DECLARE
        value JSONB;
      BEGIN
        value := CASE kind WHEN 'comparison' THEN result::jsonb -> 'verdict' -> 'chosen'
                           WHEN 'search' THEN result::jsonb -> 'models' -> 0 -> 'name' END;
        RETURN CASE WHEN jsonb_typeof(value) = 'string' THEN value #>> '{}' END;
      EXCEPTION WHEN others THEN
        RETURN NULL;
      END
      $fn$;
      INSERT INTO audit_listing (seq, best, hash)
        SELECT seq, pg_temp.parsimetry_best(kind, result), hash FROM audit_records;
    `,
  },
];
