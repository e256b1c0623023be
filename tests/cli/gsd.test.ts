import { describe, expect, it } from 'vitest';
import { runTerrainCli } from './run-cli';

describe('terrain gsd', () => {
  it('prints GSD and footprint for the issue example camera at 109.44 m (3 cm, 164.16 m x 109.44 m by hand)', async () => {
    const r = await runTerrainCli(['gsd', '--sensor-width-mm', '13.2', '--focal-mm', '8.8', '--image-width-px', '5472', '--height-m', '109.44', '--sensor-height-mm', '8.8', '--image-height-px', '3648']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(Object.keys(doc).sort()).toEqual(['footprintAcrossM', 'footprintAlongM', 'gsdCm']);
    expect(doc.gsdCm).toBeCloseTo(3, 12);
    expect(doc.footprintAcrossM).toBeCloseTo(164.16, 9);
    expect(doc.footprintAlongM).toBeCloseTo(109.44, 9);
  });

  // NPTEL course 105104100, Module 3, Lecture 21 "Flight planning", Example 1: 23 cm photos at 1:12000 with
  // f = 21 cm, i.e. 2520 m above ground, cover 2760 m (a 10 µm pixel gives a 12 cm GSD at that scale)
  it('reproduces the NPTEL Lecture 21 Example 1 footprint for a 23 cm frame', async () => {
    const r = await runTerrainCli(['gsd', '--sensor-width-mm', '230', '--focal-mm', '210', '--image-width-px', '23000', '--height-m', '2520', '--image-height-px', '23000']);
    const doc = JSON.parse(r.stdout);
    expect(doc.footprintAcrossM).toBeCloseTo(2760, 9);
    expect(doc.footprintAlongM).toBeCloseTo(2760, 9); // square pixels from the image height
    expect(doc.gsdCm).toBeCloseTo(12, 9);
  });

  it('gives no along-track footprint without the sensor or image height', async () => {
    const r = await runTerrainCli(['gsd', '--sensor-width-mm', '13.2', '--focal-mm', '8.8', '--image-width-px', '5472', '--height-m', '100']);
    expect(JSON.parse(r.stdout).footprintAlongM).toBeNull();
  });

  it('rejects missing or bad numbers with one line on stderr', async () => {
    for (const [args, pattern] of [
      [['gsd', '--sensor-width-mm', '13.2', '--focal-mm', '8.8', '--image-width-px', '5472'], /needs --height-m/],
      [['gsd', '--sensor-width-mm', '13.2', '--focal-mm=-8.8', '--image-width-px', '5472', '--height-m', '100'], /--focal-mm must be a positive number/],
      [['gsd', '--sensor-width-mm', 'wide', '--focal-mm', '8.8', '--image-width-px', '5472', '--height-m', '100'], /--sensor-width-mm must be a positive number, got "wide"/],
      [['gsd', '--lens', '8.8'], /Unknown option/],
    ] as Array<[string[], RegExp]>) {
      const r = await runTerrainCli(args);
      expect(r.code, args.join(' ')).not.toBe(0);
      expect(r.stdout).toBe('');
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
  });
});
