import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { site } from '../../db/schema';
import { startTestServer, type TestServer } from '../support/test-server';
import { deflateSync } from 'node:zlib';
import { setDoubles, setInt, setValuesPointer, TAG } from '../support/tiff-bytes';
import { filesUnder, ownProject, uploadDem } from '../support/upload-helpers';

const fixture = (name: string) => new Uint8Array(fs.readFileSync(path.join('tests/fixtures/dem', name)));

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-upload-robust-'));
const storageDir = path.join(tmpRoot, 'storage');
let srv: TestServer;

beforeAll(async () => {
  srv = await startTestServer({ web: false, env: { STORAGE_DIR: storageDir, STORAGE_DRIVER: 'disk' } });
});
afterAll(async () => {
  await srv?.stop();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

describe('uploads whose georeference is not a place on Earth', () => {
  it('refuses a tie point of 1e308 with a pixel size of 1e300 with a 422 and keeps nothing', async () => {
    const { c, teamId, base } = await ownProject(srv, 'georef-inf');
    const bytes = fixture('utm-f32-strips.tif');
    setDoubles(bytes, TAG.ModelTiepoint, [0, 0, 0, 1e308, 1e308, 0]);
    setDoubles(bytes, TAG.ModelPixelScale, [1e300, 1e300, 0]);
    const r = await uploadDem(c, base, bytes);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('no-georeference');
    expect(r.body.error.message).toMatch(/(not on Earth|at infinity).*re-export the grid from your GIS/);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
    expect(filesUnder(path.join(storageDir, '.tmp'))).toEqual([]);
    const list = await c.get(base);
    expect(list.status).toBe(200);
    expect(list.body.sites).toEqual([]);
  });

  it('refuses a geographic grid placed beyond the poles', async () => {
    const { c, base } = await ownProject(srv, 'georef-pole');
    const bytes = fixture('geo-f64-packbits.tif');
    setDoubles(bytes, TAG.ModelTiepoint, [0, 0, 0, 10, 400, 0]);
    const r = await uploadDem(c, base, bytes);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('no-georeference');
  });
});

describe('a stored site whose record does not read back', () => {
  it('is listed apart with a reason, the rest of the list still answers, and it can be deleted', async () => {
    const { c, base } = await ownProject(srv, 'bad-row');
    const good = await uploadDem(c, base, fixture('utm-f32-strips.tif'));
    expect(good.status).toBe(201);
    const other = await uploadDem(c, base, fixture('lzw-u16.tif'));
    expect(other.status).toBe(201);
    // what an infinite bound becomes in a jsonb column (JSON has no Infinity): null
    const [row] = await srv.db.select().from(site).where(eq(site.id, other.body.id));
    const metadata = row.metadata as { bounds: unknown[] };
    await srv.db.update(site).set({ metadata: { ...metadata, bounds: [null, null, null, null] } }).where(eq(site.id, other.body.id));

    const list = await c.get(base);
    expect(list.status).toBe(200);
    expect(list.body.sites.map((s: { id: string }) => s.id)).toEqual([good.body.id]);
    expect(list.body.unreadable).toEqual([expect.objectContaining({ id: other.body.id, problem: expect.stringMatching(/delete it and upload the file again/) })]);
    expect((await c.delete(`${base}/${other.body.id}`)).status).toBe(204);
    expect((await c.get(base)).body.unreadable).toEqual([]);
  });
});

describe('small files that declare a huge cost', () => {
  it('refuses a 612-byte file declaring 16384 x 16384 float32 samples before decoding anything', async () => {
    const { c, teamId, base } = await ownProject(srv, 'declared-huge');
    const bytes = fixture('utm-f32-strips.tif');
    setInt(bytes, TAG.ImageWidth, 16384);
    setInt(bytes, TAG.ImageLength, 16384);
    setInt(bytes, TAG.RowsPerStrip, 16384);
    const t0 = performance.now();
    const r = await uploadDem(c, base, bytes);
    console.info(`16384 x 16384 declared in ${bytes.length} bytes: refused in ${(performance.now() - t0).toFixed(0)} ms`);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('too-large');
    expect(r.body.error.message).toMatch(/declares 16384 x 16384 pixels \(1024 MiB of samples\) in \d+ stored bytes of a 612-byte file/);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('refuses a block that inflates far past its declared size, without inflating it all', async () => {
    const { c, teamId, base } = await ownProject(srv, 'inflate-bomb');
    const valid = fixture('tiled-deflate-fp.tif');
    // tile 0 (16 x 16 float32 = 1 KiB declared) replaced by 16 MiB of zeros, DEFLATE-packed to about 16 KB
    const bomb = deflateSync(Buffer.alloc(16 * 2 ** 20));
    const bytes = new Uint8Array(valid.length + bomb.length);
    bytes.set(valid);
    bytes.set(bomb, valid.length);
    setInt(bytes, TAG.TileOffsets, valid.length, 0);
    setInt(bytes, TAG.TileByteCounts, bomb.length, 0);
    const r = await uploadDem(c, base, bytes);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('damaged');
    expect(r.body.error.message).toMatch(/inflates far past its declared 1024 bytes/);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('refuses a grid above DEM_MAX_PIXELS, naming the limit', async () => {
    const small = await startTestServer({ web: false, env: { STORAGE_DIR: path.join(tmpRoot, 'small'), STORAGE_DRIVER: 'disk', DEM_MAX_PIXELS: '50' } });
    try {
      const { c, base } = await ownProject(small, 'max-pixels');
      const r = await uploadDem(c, base, fixture('utm-f32-strips.tif')); // 9 x 7 = 63 pixels
      expect(r.status).toBe(422);
      expect(r.body.error.code).toBe('too-large');
      expect(r.body.error.message).toMatch(/9 x 7 = 63 pixels, above this server's limit of 50 \(DEM_MAX_PIXELS\)/);
      expect((await c.get(base)).body.sites).toEqual([]);
    } finally {
      await small.stop();
    }
  });
});

describe('block tables past the end of the file', () => {
  it.each([
    ['TileOffsets', 'tiled-deflate-fp.tif', TAG.TileOffsets],
    ['TileByteCounts', 'tiled-deflate-fp.tif', TAG.TileByteCounts],
  ] as const)('refuses a %s table that lies past the end with a 422 naming it', async (name, file, tag) => {
    const { c, teamId, base } = await ownProject(srv, `table-${name}`);
    const bytes = fixture(file);
    setValuesPointer(bytes, tag, bytes.length + 4096);
    const r = await uploadDem(c, base, bytes);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('damaged');
    expect(r.body.error.message).toContain(`${name} table`);
    expect(filesUnder(path.join(storageDir, 'teams', teamId))).toEqual([]);
  });

  it('refuses tile offsets that point past the end, naming where the data would run to', async () => {
    const { c, base } = await ownProject(srv, 'offset-past-end');
    const bytes = fixture('tiled-deflate-fp.tif');
    setInt(bytes, TAG.TileOffsets, bytes.length + 10_000, 3);
    const r = await uploadDem(c, base, bytes);
    expect(r.status).toBe(422);
    expect(r.body.error.code).toBe('damaged');
    expect(r.body.error.message).toMatch(/tile 4 of \d+ .*its data is said to lie at bytes \d+-\d+, past the end of the \d+-byte file/);
  });
});
