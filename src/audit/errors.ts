// Failures a caller of the audit store must tell apart. The HTTP layer maps
// AuditUnavailable to 503 (no result without a record), AuditCursorInvalid and
// AuditQueryInvalid to 400, AuditRecordCorrupt to 500.

/** The store could not take (or could not read) records: the database is down, full or closed. */
export class AuditUnavailable extends Error {
  readonly code = 'audit_unavailable';
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'AuditUnavailable';
  }
}

/** The record offered to append is not a valid record (a programming error upstream). */
export class AuditRecordInvalid extends Error {
  readonly code = 'audit_record_invalid';
  constructor(readonly problems: string[]) {
    super(`audit record refused: ${problems.join('; ')}`);
    this.name = 'AuditRecordInvalid';
  }
}

/** A stored row no longer reads back as a record (edited or damaged in the database). */
export class AuditRecordCorrupt extends Error {
  readonly code = 'audit_record_corrupt';
  constructor(readonly seq: number, readonly id: string | null, readonly problems: string[]) {
    super(`stored audit record ${id ?? `#${seq}`} is unreadable: ${problems.join('; ')}`);
    this.name = 'AuditRecordCorrupt';
  }
}

export class AuditCursorInvalid extends Error {
  readonly code = 'audit_cursor_invalid';
  constructor() {
    super('the cursor is not one this store issued');
    this.name = 'AuditCursorInvalid';
  }
}

export class AuditQueryInvalid extends Error {
  readonly code = 'audit_query_invalid';
  constructor(readonly problems: string[]) {
    super(`audit list query refused: ${problems.join('; ')}`);
    this.name = 'AuditQueryInvalid';
  }
}
