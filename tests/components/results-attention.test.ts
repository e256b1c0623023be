import fs from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { attentionItems, lineList, standingWarningCodes } from '../../components/results/attention';
import { readDem } from '../../terrain/dem';
import { resolveMission } from '../../terrain/mission';
import { analysePlan, type PlanResult } from '../../terrain/plan';
import { resultOverview } from '../../contracts/result-parts';

// The example mission over the synthetic demo grid (datasets/README.md): it flags most photos and has short legs.
let result: PlanResult;
beforeAll(async () => {
  const grid = await readDem(new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif')));
  result = analysePlan(grid, resolveMission(JSON.parse(fs.readFileSync('datasets/example-mission.json', 'utf8'))));
}, 60_000);

describe('what is wrong and where', () => {
  it('writes line numbers as short runs', () => {
    expect(lineList([5, 1, 2, 3])).toBe('lines 1–3, 5');
    expect(lineList([4])).toBe('line 4');
    expect(lineList([7, 8, 10])).toBe('lines 7, 8, 10');
  });

  it('counts every flagged photo once, under the lines that hold them', () => {
    const items = attentionItems(resultOverview(result));
    const photoItems = items.filter((i) => i.key.startsWith('photos-'));
    const counted = photoItems.reduce((t, i) => t + Number(/: ([\d,]+) photos?\./.exec(i.title)![1].replace(/,/g, '')), 0);
    const flagged = result.lines.flatMap((l) => l.stations).filter((s) => s.flags.length > 0).length;
    expect(flagged).toBeGreaterThan(0);
    expect(counted).toBe(flagged);
    const flaggedLines = result.lines.filter((l) => l.stations.some((s) => s.flags.length > 0)).map((l) => l.index + 1);
    expect(new Set(photoItems.flatMap((i) => i.lines))).toEqual(new Set(flaggedLines));
  });

  it('names each kind of line warning once with all its lines, and says no plan-wide warning twice', () => {
    const items = attentionItems(resultOverview(result));
    const shortLegLines = result.lines.filter((l) => l.warnings.some((w) => w.code === 'short-leg')).map((l) => l.index + 1);
    expect(shortLegLines.length).toBeGreaterThan(1);
    const shortLegs = items.filter((i) => i.key === 'line-short-leg');
    expect(shortLegs).toHaveLength(1);
    expect(shortLegs[0].lines.sort((a, b) => a - b)).toEqual(shortLegLines);
    const titles = items.map((i) => i.title);
    expect(new Set(titles).size).toBe(titles.length);
    for (const w of result.warnings) {
      const said = titles.filter((t) => t === w.message).length;
      expect(said, w.code).toBe(standingWarningCodes.has(w.code) || w.code === 'short-leg' || w.code === 'band-not-held' || w.code === 'stations-flagged' || w.code === 'ground-unknown' ? 0 : 1);
    }
  });

  it('sums the stretches off the band to the engine\'s own total, in words without reason codes', () => {
    const items = attentionItems(resultOverview(result)).filter((i) => i.key === 'unmet');
    expect(items).toHaveLength(1);
    const total = Number(/over ([\d,]+) m of line/.exec(items[0].title)![1].replace(/,/g, ''));
    expect(Math.abs(total - result.summary.unmetLengthM)).toBeLessThanOrEqual(0.5); // rounded to the metre
    const parts = [...items[0].title.matchAll(/\(([\d,]+) m\)/g)].reduce((t, m) => t + Number(m[1].replace(/,/g, '')), 0);
    expect(Math.abs(parts - result.summary.unmetLengthM)).toBeLessThanOrEqual(items[0].title.split(';').length); // each part rounded
    expect(items[0].title).not.toMatch(/climb-limit|descent-limit|max-agl|leg-limits/);
    const unmetLines = result.lines.filter((l) => l.unmet.length > 0).map((l) => l.index + 1);
    expect(items[0].lines.sort((a, b) => a - b)).toEqual(unmetLines);
  });

  it('finds nothing to say about a plan without flags, stretches or warnings, and does not change its input', () => {
    const clean = JSON.parse(JSON.stringify(result)) as PlanResult;
    for (const l of clean.lines) {
      l.unmet = [];
      l.warnings = [];
      for (const s of l.stations) s.flags = [];
    }
    clean.warnings = clean.warnings.filter((w) => standingWarningCodes.has(w.code));
    const before = JSON.stringify(clean);
    expect(attentionItems(resultOverview(clean))).toEqual([]);
    expect(JSON.stringify(clean)).toBe(before);
  });
});
