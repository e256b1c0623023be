import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorForLog } from '../../server/http/error-log';
import { startTestServer, type TestServer } from '../support/test-server';

let srv: TestServer;
beforeAll(async () => {
  srv = await startTestServer({ web: false });
});
afterAll(async () => srv?.stop());

const secret = 'Smith & Sons private quarry 0471';

describe('the server log of a database error', () => {
  it('names the SQLSTATE but quotes neither the query values nor the message that repeats them', async () => {
    // PostgreSQL repeats the bad value in its message: invalid input syntax for type uuid: "…" (SQLSTATE 22P02).
    const err = await srv.db.execute(sql`select ${secret}::uuid`).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).not.toBeNull();
    expect(String((err as Error).message) + JSON.stringify(err, Object.getOwnPropertyNames(err))).toContain(secret); // the raw error does carry it
    const line = errorForLog(err);
    expect(line).toMatch(/^database error \(SQLSTATE 22P02/);
    expect(line).not.toContain(secret);
    expect(line).not.toContain('0471');
  });

  it('names the constraint of a unique violation without the key value', async () => {
    const err = await srv.db.$client.query('insert into "user" (id, name, email, email_verified, created_at, updated_at) select id, $1, email, false, now(), now() from "user" limit 1', [secret]).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).not.toBeNull();
    const line = errorForLog(err);
    expect(line).toMatch(/SQLSTATE 23505, table user, constraint /);
    expect(line).not.toContain(secret);
  });

  it('keeps other errors as they are (message and stack)', () => {
    expect(errorForLog(new Error('disk full'))).toMatch(/^Error: disk full\n\s+at /);
  });
});
