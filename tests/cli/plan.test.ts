import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';
import { planResultSchema } from '../../contracts/plan-result';
import { missionSchema } from '../../contracts/mission';
import { generalCautions } from '../../contracts/cautions';

const DEM = 'datasets/harrow-fell-dem.tif';
const MISSION = 'datasets/example-mission.json';
const tmp = mkdtempSync(join(tmpdir(), 'loftline-plan-'));
const example = JSON.parse(readFileSync(new URL(`../../${MISSION}`, import.meta.url), 'utf8'));

function writeMission(patch: Record<string, unknown>): string {
  const path = join(tmp, `m-${Math.random().toString(36).slice(2)}.json`);
  writeFileSync(path, JSON.stringify({ ...example, ...patch }));
  return path;
}

describe('terrain plan', () => {
  it('is given a valid example mission over the demo grid', () => {
    expect(missionSchema.safeParse(example).success).toBe(true);
  });

  it('prints the plan document for the demo grid and example mission', async () => {
    const r = await runTerrainCli(['plan', DEM, '--mission', MISSION]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const printed = JSON.parse(r.stdout);
    const doc = planResultSchema.parse(printed);
    expect(printed.cautions).toEqual([...generalCautions]);
    expect(printed.cautions.at(-1)).toMatch(/^Local regulations and licensed practice govern every flight/);
    expect(doc.lines.length).toBe(doc.summary.lineCount);
    expect(doc.summary.photoCount).toBe(doc.lines.reduce((n, l) => n + l.stations.length, 0));
    expect(doc.headingAdvice).not.toBeNull(); // the example asks for advice
    expect(doc.heights.verticalDatum?.epsg).toBe(5773); // the demo grid's EGM96 heights
    // the quarry face and the valley cannot all be held within the band: said, with reasons
    expect(doc.lines.some((l) => l.unmet.length > 0)).toBe(true);
    for (const l of doc.lines) for (const s of l.stations) if (s.aglM !== null) expect(s.aglM).toBeGreaterThanOrEqual(example.clearanceM + example.obstacleAllowanceM - 1e-3);
    expect(doc.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['bare-earth', 'local-rules', 'wind']));
  }, 60_000);

  it('fails with one line on stderr for a bad mission, a missing file or a takeoff off the grid', async () => {
    for (const [args, code, pattern] of [
      [['plan', DEM, '--mission', writeMission({ sideOverlap: 70 })], 1, /error \(invalid-input\): sideOverlap must be a number from 0 to 0\.95, got 70/],
      [['plan', DEM, '--mission', writeMission({ takeoff: { lon: 4.3, lat: 46.77 } })], 1, /takeoff point .* off the elevation grid/],
      [['plan', DEM, '--mission', join(tmp, 'nope.json')], 1, /Cannot read mission file/],
      [['plan', DEM], 2, /needs --mission/],
      [['plan', '--mission', MISSION], 2, /one DEM file/],
    ] as Array<[string[], number, RegExp]>) {
      const r = await runTerrainCli(args);
      expect(r.code, args.join(' ')).toBe(code);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
    const bad = join(tmp, 'bad.json');
    writeFileSync(bad, '{ "area": ');
    const r = await runTerrainCli(['plan', DEM, '--mission', bad]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/not valid JSON/);
  }, 180_000); // six runs of the command line: slow on a shared machine
});
