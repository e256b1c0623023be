import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { readDem, readDemHeader } from '../../terrain/dem';
import { blockName } from '../../terrain/dem-damage';
import { TerrainError } from '../../terrain/errors';

// Files broken on purpose after GDAL 3.6.2 wrote them, and what `gdalinfo -checksum` says about each
// (tests/fixtures/grid-trust/make-fixtures.py, reference.json "damaged")
const ref = JSON.parse(readFileSync(new URL('../fixtures/grid-trust/reference.json', import.meta.url), 'utf8')).damaged;
const fixture = (name: string) => readFileSync(new URL(`../fixtures/grid-trust/${name}`, import.meta.url));
const nodeInflate = (d: Uint8Array, n: number) => inflateSync(d, { chunkSize: Math.max(1024, n + 64) });

/** GDAL's "IReadBlock failed at X offset c, Y offset r" (counted from 0) for a file. */
function gdalBlock(name: string): { col: number; row: number } {
  const line = ref.files[name].gdalinfoChecksum.errors.find((e: string) => e.includes('IReadBlock failed'));
  const m = /X offset (\d+), Y offset (\d+)/.exec(line);
  return { col: Number(m![1]), row: Number(m![2]) };
}

async function refusal(p: Promise<unknown>): Promise<TerrainError> {
  const err = await p.then(() => null, (e) => e);
  expect(err).toBeInstanceOf(TerrainError);
  return err as TerrainError;
}

describe('damaged GeoTIFFs are refused naming the damaged part', () => {
  for (const [name, inflate] of [['damaged-deflate-tile.tif', nodeInflate], ['damaged-deflate-tile.tif', undefined], ['cut-deflate-tile.tif', nodeInflate], ['cut-deflate-tile.tif', undefined]] as const) {
    it(`names the tile GDAL cannot decode in ${name} (${inflate ? 'node:zlib' : 'geotiff.js'} inflate)`, async () => {
      expect(ref.files[name].gdalinfoChecksum.errors.join(' ')).toMatch(/ZIPDecode:Decoding error/);
      const { col, row } = gdalBlock(name);
      const tile = row * ref.tilesAcross + col + 1;
      const err = await refusal(readDem(fixture(name), { inflate }));
      expect(err.code).toBe('damaged');
      expect(err.message).toContain(`The file is damaged at tile ${tile} of 24 (row ${row + 1}, column ${col + 1}): its DEFLATE data does not decode (`);
      expect(err.message).toMatch(/re-export it/);
      expect(err.message).not.toMatch(/\n/);
    });
  }

  it('names the tile GDAL reads short in a file cut inside its last tile (truncated)', async () => {
    const name = 'cut-in-last-tile.tif';
    expect(ref.files[name].gdalinfoChecksum.errors.join(' ')).toMatch(/TIFFFillTile:Read error .* tile 23;/);
    const { col, row } = gdalBlock(name);
    const err = await refusal(readDemHeader(fixture(name)));
    expect(err.code).toBe('truncated');
    expect(err.message).toContain(`inside tile ${row * ref.tilesAcross + col + 1} of 24 (row ${row + 1}, column ${col + 1})`);
    expect(err.message).toMatch(/upload the complete file/);
  });

  it('names a tile whose offset points past the end of the file (damaged, not cut short)', async () => {
    const name = 'tile-offset-beyond-file.tif';
    const { col, row } = gdalBlock(name);
    expect(row * ref.tilesAcross + col).toBe(ref.files[name].tileIndex);
    const err = await refusal(readDemHeader(fixture(name)));
    expect(err.code).toBe('damaged');
    expect(err.message).toContain(`at tile ${row * ref.tilesAcross + col + 1} of 24 (row ${row + 1}, column ${col + 1}): its data is said to lie at bytes`);
  });

  for (const [name, table] of [['tile-offsets-past-end.tif', 'TileOffsets'], ['strip-offsets-past-end.tif', 'StripOffsets']]) {
    it(`names the ${table} table that lies past the end of the file`, async () => {
      expect(ref.files[name].gdalinfoChecksum.errors[0]).toMatch(/Cannot read offset\/size for strile/);
      const err = await refusal(readDemHeader(fixture(name)));
      expect(err.code).toBe('damaged');
      expect(err.message).toBe(`The file is damaged in its ${table} table: it lies past the end of the ${ref.files[name].fileBytes}-byte file; re-export it from your GIS.`);
    });
  }

  it('counts strips by image rows', () => {
    const layout = { tiled: false, blockHeight: 2, blocksAcross: 1, blocksDown: 6 };
    expect(blockName(0, layout, 11)).toBe('strip 1 of 6 (image rows 1-2)');
    expect(blockName(5, layout, 11)).toBe('strip 6 of 6 (image row 11)');
  });
});
