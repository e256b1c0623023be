import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';
import { generalCautions } from '../../contracts/cautions';
import { planResultSchema } from '../../contracts/plan-result';

const DEM = 'datasets/harrow-fell-dem.tif';
const tmp = mkdtempSync(join(tmpdir(), 'loftline-solve-'));
const example = JSON.parse(readFileSync(new URL('../../datasets/example-mission.json', import.meta.url), 'utf8'));

function writeMission(patch: Record<string, unknown>): string {
  const path = join(tmp, `m-${Math.random().toString(36).slice(2)}.json`);
  writeFileSync(path, JSON.stringify({ ...example, ...patch }));
  return path;
}

describe('terrain solve', () => {
  it('prints the solved plan in the plan shape, with a reason for every line and the raster proof', async () => {
    const mission = writeMission({ envelope: { preset: 'multirotor' }, spec: { maxGsdCm: 2.75, minViews: 2 } });
    const r = await runTerrainCli(['solve', DEM, '--mission', mission]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    planResultSchema.parse(doc); // the same shape as `plan`
    expect(doc.cautions).toEqual([...generalCautions]);
    expect(doc.pattern).toBe('furrow');
    expect(doc.summary.lineCount).toBe(doc.lines.length);
    if (doc.choices.fallback === null) {
      expect(doc.choices.lines).toHaveLength(doc.lines.length);
      // spacing varies line by line, and each spacing names the ground that set it, with its datum
      const spacings = doc.choices.lines.map((l: { spacingToNextM: number | null }) => l.spacingToNextM).filter((s: number | null) => s !== null);
      expect(new Set(spacings.map((s: number) => Math.round(s))).size).toBeGreaterThan(2);
      const layout = doc.choices.lines.filter((l: { kind: string }) => l.kind === 'line');
      for (const l of layout.slice(0, -1)) expect(l.reasons[0]).toMatch(/^ground at [\d.]+ m above EGM96 .* between lines \d+ and \d+ .* [\d.]+ m spacing keeps the 10 % side overlap floor/);
      // spot photos: one station each, over ground the layout's photos see too coarsely, with the height and its GSD
      const spots = doc.choices.lines.filter((l: { kind: string }) => l.kind === 'spot');
      for (const l of spots) {
        expect(doc.lines[l.line - 1].stations).toHaveLength(1);
        // a spot is a 1 m hover by design: it is not held to the layout's shortest-leg setting
        expect(doc.lines[l.line - 1].warnings.map((w: { code: string }) => w.code)).not.toContain('short-leg');
        expect(l.reasons[0]).toMatch(/^spot photo straight above ground sloping \d+° at [\d.]+ m above EGM96 .* no finer than the spec's 2.75 cm\. [\d.]+ m above the ground gives about [\d.]+ cm along the slope/);
      }
      // every leg carries its speed and photo spacing; no leg is faster than the mission's speed
      for (const line of doc.lines) for (const g of line.legs) {
        expect(g.speedMps).toBeGreaterThan(0);
        expect(g.speedMps).toBeLessThanOrEqual(example.speedMps);
      }
    }
    // the proof is the plan's own raster over the reachable cells; the quarry face is listed as unreachable, with its reason
    expect(doc.proof.cellsInArea).toBeGreaterThan(30_000);
    expect(doc.proof.reachableCells).toBe(doc.proof.cellsInArea - doc.unreachable.reduce((t: number, u: { cells: number }) => t + u.cells, 0));
    expect(doc.proof.shortCells === 0).toBe(doc.proof.meets);
    // the layout and its spot photos meet the spec on every reachable cell of the demo
    expect(doc.proof.meets).toBe(true);
    const slope = doc.unreachable.find((u: { reason: string }) => u.reason === 'slope-gsd');
    expect(slope.message).toMatch(/ground sloping up to [\d.]+°: .* 35 m clearance and allowance .* 2.75 cm/);
    expect(doc.comparison.uniform[0].setting).toMatchObject({ forwardOverlap: 0.8, sideOverlap: 0.7, mode: 'follow' });
  }, 180_000);

  it('fails with one line on stderr for a missing mission or a bad solve setting', async () => {
    for (const [args, code, pattern] of [
      [['solve', DEM], 2, /solve needs --mission/],
      [['solve', DEM, '--mission', writeMission({ solve: { pattern: 'spiral' } })], 1, /solve.pattern must be "furrow" .*, "lattice" .* or "slant"/],
      [['solve', DEM, '--mission', writeMission({ solve: { minSideOverlap: 2 } })], 1, /solve.minSideOverlap must be a number from 0 to 0.9/],
    ] as Array<[string[], number, RegExp]>) {
      const r = await runTerrainCli(args);
      expect(r.code, args.join(' ')).toBe(code);
      expect(r.stderr).toMatch(pattern);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
  }, 120_000);
});
