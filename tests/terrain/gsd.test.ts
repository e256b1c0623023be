import { describe, expect, it } from 'vitest';
import { airBaseM, flatOverlap, footprintM, gsdCm, heightForGsdM, lineSpacingM, photoScale } from '../../terrain/gsd';
import type { Camera } from '../../terrain/camera';
import { TerrainError } from '../../terrain/errors';

/** A 23 cm x 23 cm film frame camera; the pixel count (10 µm pixels) only matters for GSD. */
const filmCamera = (focalLengthMm: number): Camera => ({ sensorWidthMm: 230, sensorHeightMm: 230, focalLengthMm, imageWidthPx: 23000, imageHeightPx: 23000 });

describe('flat-ground photo geometry against published worked examples', () => {
  // NPTEL course 105104100, Module 3 "Photogrammetry", Lecture 21 "Flight planning", Example 1
  // (archive.nptel.ac.in/content/storage2/courses/105104100/lectureC_33/C_33_3.htm): 45 km x 36 km at an
  // average scale of 1:12000, f = 21 cm, 23 cm square photos, 60 % forward and 30 % side overlap, terrain
  // 500 m above MSL, 200 km/h. Published: exposure interval kept at 19 s, adjusted base 55.55 x 19 =
  // 1055.45 m, 44 photos a line before the extra ones, 20 flight lines, 960 photos in all.
  it('reproduces NPTEL Lecture 21 Example 1 (scale 1:12000, f = 21 cm, 60/30 %)', () => {
    const cam = filmCamera(210);
    const heightAboveGround = heightForScale(210, 12000); // f / S = 2520 m
    expect(heightAboveGround).toBeCloseTo(2520, 9);
    expect(photoScale(210, heightAboveGround + 500, 500)).toBeCloseTo(1 / 12000, 15);
    expect(footprintM(cam, heightAboveGround).alongM).toBeCloseTo(2760, 9);
    const base = airBaseM(cam, heightAboveGround, 0.6);
    expect(base).toBeCloseTo(1104, 9);
    const speed = 55.55; // 200 km/h as the example rounds it
    const interval = Math.floor(base / speed); // rounded down so the overlap stays at least 60 %
    expect(interval).toBe(19);
    expect(speed * interval).toBeCloseTo(1055.45, 6);
    expect(Math.ceil(45000 / (speed * interval)) + 1).toBe(44);
    const spacing = lineSpacingM(cam, heightAboveGround, 0.3);
    expect(spacing).toBeCloseTo(1932, 9);
    expect(Math.ceil(36000 / spacing) + 1).toBe(20); // lines, with one extra strip as the example's safety factor
    // GSD = pixel pitch / scale: 10 µm at 1:12000 is 12 cm (the same relation in digital form)
    expect(gsdCm(cam, heightAboveGround)).toBeCloseTo(12, 9);
  });

  // Flight-plan worked example of Wolf, Dewitt & Wilkinson, "Elements of Photogrammetry with Applications
  // in GIS", 4th ed., ch. 18 (project planning) — from memory that it is the book's; the numbers as reproduced
  // in the lecture deck "Flight Planning AP Calculation" (scribd presentation 20607005): f = 152.4 mm,
  // 230 mm format, scale 1:25000, terrain 300 m above datum: H = 4110 m above datum, 5750 m coverage,
  // 2300 m between photo centres at 60 % endlap.
  it('reproduces the 1:25000 flight-plan example (H = 4110 m, coverage 5750 m, base 2300 m)', () => {
    const cam = filmCamera(152.4);
    const hag = heightForScale(152.4, 25000);
    expect(hag + 300).toBeCloseTo(4110, 9);
    expect(footprintM(cam, hag).acrossM).toBeCloseTo(5750, 9);
    expect(airBaseM(cam, hag, 0.6)).toBeCloseTo(2300, 9);
    expect(lineSpacingM(cam, hag, 0.3)).toBeCloseTo(0.7 * 5750, 9);
  });

  // "Flight Planning for Aerial Photography" worked example (scribd document 459209253): 4 km x 4 km,
  // f = 152.4 mm, 230 mm format, 1:10000, 60 % / 30 %, terrain 90 m: flying height 1614 m above sea level,
  // 2300 m coverage, 920 m between photo centres, 1610 m between flight lines.
  it('reproduces the 1:10000 flight-plan example (1614 m, 2300 m, 920 m, 1610 m)', () => {
    const cam = filmCamera(152.4);
    const hag = heightForScale(152.4, 10000);
    expect(hag + 90).toBeCloseTo(1614, 9);
    expect(footprintM(cam, hag).alongM).toBeCloseTo(2300, 9);
    expect(airBaseM(cam, hag, 0.6)).toBeCloseTo(920, 9);
    expect(lineSpacingM(cam, hag, 0.3)).toBeCloseTo(1610, 9);
  });

  // Scale over terrain of elevation h, S = f / (H - h) (Wolf, Dewitt & Wilkinson, ch. 6). The numbers are
  // those of the book's ground-length example as remembered (f = 152.4 mm, H = 1385 m above datum, points
  // at 204 m and 148 m) — from memory; the scales are recomputed here by hand: 1:7749.3 and 1:8116.8.
  it('gives the larger scale over higher ground (f / (H - h))', () => {
    const sA = photoScale(152.4, 1385, 204);
    const sB = photoScale(152.4, 1385, 148);
    expect(1 / sA).toBeCloseTo(1181 / 0.1524, 6);
    expect(1 / sA).toBeCloseTo(7749.34, 1);
    expect(1 / sB).toBeCloseTo(8116.80, 1);
    expect(sA).toBeGreaterThan(sB);
  });
});

describe('GSD and height', () => {
  it('are inverse of each other and linear in height (the example mission camera at 3 cm)', () => {
    const cam: Camera = { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 };
    const h = heightForGsdM(cam, 3);
    // 3 cm x 8.8 mm / (13.2 mm / 5472) = 109.44 m (computed by hand)
    expect(h).toBeCloseTo(109.44, 9);
    expect(gsdCm(cam, h)).toBeCloseTo(3, 12);
    expect(gsdCm(cam, 2 * h)).toBeCloseTo(6, 12);
    const fp = footprintM(cam, h);
    expect(fp.acrossM).toBeCloseTo(3 * 5472 / 100, 9); // GSD x pixels across
    expect(fp.alongM).toBeCloseTo(3 * 3648 / 100, 9);
  });

  it('flat overlap is 1 - B / G, clamped to [0, 1]', () => {
    expect(flatOverlap(100, 20)).toBeCloseTo(0.8, 15);
    expect(flatOverlap(100, 150)).toBe(0);
    expect(flatOverlap(0, 10)).toBe(0);
  });

  it('throws invalid-input on impossible heights, GSDs and overlaps', () => {
    const cam = filmCamera(152.4);
    expect(() => gsdCm(cam, 0)).toThrow(TerrainError);
    expect(() => gsdCm(cam, -5)).toThrow(/positive/);
    expect(() => heightForGsdM(cam, 0)).toThrow(TerrainError);
    expect(() => photoScale(152.4, 100, 120)).toThrow(TerrainError);
    expect(() => airBaseM(cam, 100, 1)).toThrow(/forward overlap/);
    expect(() => lineSpacingM(cam, 100, -0.1)).toThrow(/side overlap/);
  });
});

function heightForScale(focalMm: number, scaleNumber: number): number {
  return (focalMm / 1000) * scaleNumber;
}
