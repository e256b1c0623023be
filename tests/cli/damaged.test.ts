import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';

// tests/fixtures/grid-trust/make-fixtures.py: files broken on purpose after GDAL 3.6.2 wrote them
describe('terrain command line on damaged files', () => {
  it('prints one line naming the damaged tile and exits 1, not 70', async () => {
    const r = await runTerrainCli(['info', 'tests/fixtures/grid-trust/damaged-deflate-tile.tif']);
    expect(r.code).toBe(1);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^error \(damaged\): The file is damaged at tile 12 of 24 \(row 2, column 4\): its DEFLATE data does not decode \(.+\); re-export it from your GIS\.\n$/);
  });

  it('names an offset table past the end of the file in sample as well', async () => {
    const r = await runTerrainCli(['sample', 'tests/fixtures/grid-trust/tile-offsets-past-end.tif', '--at', '400010,6599990', '--crs', 'EPSG:32632']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^error \(damaged\): The file is damaged in its TileOffsets table: it lies past the end/);
  });
});
