/**
 * What an unexpected error writes to the server log. A database error carries the values of its query (Drizzle's
 * "Failed query … params: …") and PostgreSQL's message and detail quote them ('invalid input syntax for type uuid:
 * "…"', 'Key (name)=(…) already exists'): user text that has no place in a log. For those only the SQLSTATE and
 * the names of what failed are logged; the SQLSTATE codes are listed in the PostgreSQL manual, appendix A.
 */

interface PgErrorLike {
  code?: string;
  severity?: string;
  routine?: string;
  table?: string;
  column?: string;
  constraint?: string;
}

function databaseErrorOf(err: unknown): PgErrorLike | null {
  const e = err as { cause?: unknown; query?: unknown; code?: unknown; severity?: unknown } | null;
  if (!e || typeof e !== 'object') return null;
  if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code) && typeof e.severity === 'string') return e as PgErrorLike;
  if (typeof e.query === 'string') return databaseErrorOf(e.cause) ?? {};
  return null;
}

/** One log line (plus the stack's own frames) that names the failure without quoting any value. */
export function errorForLog(err: unknown): string {
  const db = databaseErrorOf(err);
  if (db) {
    const names = (['table', 'column', 'constraint', 'routine'] as const).filter((k) => db[k]).map((k) => `${k} ${db[k]}`);
    const frames = ((err as Error).stack ?? '').split('\n').filter((l) => /^\s+at /.test(l)).slice(0, 6).join('\n');
    return `database error (SQLSTATE ${db.code ?? 'unknown'}${names.length ? `, ${names.join(', ')}` : ''}); query values left out\n${frames}`;
  }
  return err instanceof Error ? (err.stack ?? err.message) : String(err);
}

/** The server's default log of unexpected errors. */
export function logServerError(err: unknown): void {
  console.error(`loftline: ${errorForLog(err)}`);
}
