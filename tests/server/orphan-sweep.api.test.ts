import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDiskStorage } from '../../server/storage/disk-storage';
import { sweepOrphans } from '../../server/storage/orphan-sweep';
import { startTestServer, type TestServer } from '../support/test-server';
import { filesUnder, ownProject, uploadDem } from '../support/upload-helpers';

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-sweep-'));
const servers: TestServer[] = [];
afterAll(async () => {
  for (const s of servers) await s.stop();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

/** Write `rel` under `dir` with a modification time `ageMin` minutes ago (what a crash long ago left). */
function debris(dir: string, rel: string, ageMin: number) {
  const f = path.join(dir, rel);
  fs.mkdirSync(path.dirname(f), { recursive: true });
  fs.writeFileSync(f, 'left by a crash');
  const t = new Date(Date.now() - ageMin * 60_000);
  fs.utimesSync(f, t, t);
}

describe('crash debris in storage', () => {
  it('is removed at start when older than the grace period: partial uploads and grids without a site row', async () => {
    const storageDir = path.join(tmpRoot, 'start');
    const env = { STORAGE_DIR: storageDir, STORAGE_DRIVER: 'disk', ORPHAN_GRACE_MINUTES: '60' };
    const first = await startTestServer({ web: false, env });
    servers.push(first);
    const { c, teamId, base } = await ownProject(first, 'sweep');
    const kept = await uploadDem(c, base, new Uint8Array(fs.readFileSync('tests/fixtures/dem/utm-f32-strips.tif')));
    expect(kept.status).toBe(201);
    const keptFiles = [`teams/${teamId}/sites/${kept.body.id}/dem.tif`, `teams/${teamId}/sites/${kept.body.id}/hillshade.png`];
    // the kept site's files are old too: age alone must never remove a grid that has its row
    for (const k of keptFiles) fs.utimesSync(path.join(storageDir, k), new Date(0), new Date(0));
    const lost = crypto.randomUUID(), recent = crypto.randomUUID();
    debris(storageDir, `teams/${teamId}/sites/${lost}/dem.tif`, 120);
    debris(storageDir, `teams/${teamId}/sites/${lost}/hillshade.png`, 120);
    debris(storageDir, `teams/${teamId}/sites/${recent}/dem.tif`, 5); // an upload perhaps still being checked
    debris(storageDir, `.tmp/${crypto.randomUUID()}.part`, 120);
    const freshPart = `.tmp/${crypto.randomUUID()}.part`;
    debris(storageDir, freshPart, 1);

    // a restart: the new process sweeps on its way up
    await first.stop();
    servers.pop();
    const second = await startTestServer({ web: false, env });
    servers.push(second);
    const expected = [freshPart, ...keptFiles, `teams/${teamId}/sites/${recent}/dem.tif`].sort();
    for (let i = 0; i < 100 && JSON.stringify(filesUnder(storageDir)) !== JSON.stringify(expected); i++) await new Promise((r) => setTimeout(r, 100));
    expect(filesUnder(storageDir)).toEqual(expected);
  });

  it('reports what one sweep removed', async () => {
    const dir = path.join(tmpRoot, 'direct');
    const storage = createDiskStorage(dir);
    const id = crypto.randomUUID();
    debris(dir, `teams/t1/sites/${id}/dem.tif`, 90);
    debris(dir, `.tmp/${id}.part`, 90);
    const srv = await startTestServer({ web: false, env: { STORAGE_DIR: path.join(tmpRoot, 'unused'), STORAGE_DRIVER: 'disk' } });
    servers.push(srv);
    const r = await sweepOrphans({ storage, db: srv.db, graceMs: 60 * 60_000 });
    expect(r).toEqual({ partial: [`.tmp/${id}.part`], orphans: [`teams/t1/sites/${id}/dem.tif`] });
    expect(filesUnder(dir)).toEqual([]);
  });
});
