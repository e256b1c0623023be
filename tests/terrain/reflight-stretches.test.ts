import { describe, expect, it } from 'vitest';
import { booleanPointInPolygon, point, polygon, lineString, pointToLineDistance, polygonToLine } from '@turf/turf';
import { simulateFlight } from './as-flown-flight';
import { analyseAsFlown } from '../../terrain/as-flown';
import { cellMeetsSpec } from '../../terrain/coverage-spec';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import { MIN_REFLIGHT_PATCH_SHARE, planReflight } from '../../terrain/reflight';
import { cameraToLocal, castPixel } from '../../terrain/footprint';
import { localHeights } from '../../terrain/local-frame';
import { reflightStretches } from '../../terrain/reflight-stretches';
import { AS_FLOWN_MAP_LEGEND, asFlownMap } from '../../terrain/as-flown-map';
import proj4 from 'proj4';
import pngjs from 'pngjs';
import { cellX, cellY } from '../../terrain/coverage-grid';

const { PNG } = pngjs;

// The same simulated flight as the as-flown tests: six skipped triggers in a row on line 2 and one on line 4.
const SKIP = [7, 8, 9, 10, 11, 12].map((station) => ({ line: 2, station })).concat([{ line: 4, station: 6 }]);
const SETTINGS = { cellM: 2, maxCells: 4_000_000, imageErrorPx: 0.5, occlusion: true };

describe('re-flight as stretches of the signed-off lines', () => {
  const sim = simulateFlight(SKIP);
  const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
  const asFlown = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, sim.photos, spec, SETTINGS);
  const r = planReflight(sim.site.grid, sim.missionInput, sim.mission, asFlown, spec, SETTINGS)!;
  const s = reflightStretches(sim.site.grid, sim.mission, asFlown, spec, SETTINGS);
  const { cells } = asFlown.flown;
  const minCells = (MIN_REFLIGHT_PATCH_SHARE * sim.plan.summary.triggerDistanceM * sim.plan.summary.lineSpacingM) / cells.cellAreaM2;
  const target = asFlown.difference.lostPatches.filter((p) => p.length >= minCells).flatMap((p) => [...p]);

  it('takes again every station whose ground footprint holds lost ground (footprints cast on the grid, point in polygon by @turf/boolean-point-in-polygon 7)', () => {
    expect(s.targetCells).toBe(target.length);
    expect(s.targetCells).toBe(r.targetCells);
    expect(s.stretches.length).toBeGreaterThan(0);
    const { heightAt } = localHeights(sim.site.grid, asFlown.frame);
    const W = sim.mission.camera.imageWidthPx, H = sim.mission.camera.imageHeightPx, N = 16;
    const ll = (x: number, y: number) => asFlown.frame.toLonLat(x, y);
    const lostPoints = target.map((i) => point(ll(cellX(cells, i), cellY(cells, i))));
    let clearlyNeeded = 0;
    sim.plan.lines.forEach((line, li) => line.stations.forEach((st, si) => {
      const [x, y] = asFlown.frame.toLocal(st.lon, st.lat);
      const pose = { xM: x, yM: y, altitudeM: st.altitudeM, yawDeg: line.headingDeg };
      const rot = cameraToLocal(sim.mission.camera, pose);
      const border: number[][] = [];
      for (let k = 0; k < N; k++) border.push([(W * k) / N, 0]);
      for (let k = 0; k < N; k++) border.push([W, (H * k) / N]);
      for (let k = 0; k < N; k++) border.push([W - (W * k) / N, H]);
      for (let k = 0; k < N; k++) border.push([0, H - (H * k) / N]);
      const ring = border.map(([u, v]) => castPixel(sim.mission.camera, pose, rot, u, v, heightAt)).filter((g): g is [number, number, number] => g !== null).map((g) => ll(g[0], g[1]));
      if (ring.length < 4 * N) return;
      const poly = polygon([[...ring, ring[0]]]);
      const edge = polygonToLine(poly);
      // a lost cell well inside the footprint (more than 2 m from its edge: the footprint's straight segments between rays)
      const holds = lostPoints.some((p) => booleanPointInPolygon(p, poly) && pointToLineDistance(p, edge as never, { units: 'meters' }) > 2);
      if (!holds) return;
      clearlyNeeded++;
      expect(s.stretches.some((x) => x.line === li + 1 && x.firstPhoto <= si + 1 && x.lastPhoto >= si + 1)).toBe(true);
    }));
    expect(clearlyNeeded).toBeGreaterThan(0);
    expect(s.photos).toBeGreaterThanOrEqual(s.neededStations);
  });

  it('mends every lost cell with the photos already taken (the coverage engine, itself checked against gdal_rasterize), with fewer photos than the area re-flight', () => {
    expect(s.coveredCells).toBe(s.targetCells);
    expect(s.photos).toBeLessThan(r.photoCount);
    console.log(`same-day stretches: ${s.stretches.length} stretches, ${s.photos} photos (${s.neededStations} needed), ${s.lengthM.toFixed(0)} m; mend ${s.coveredCells} of ${s.targetCells}; area re-flight ${r.photoCount} photos, mends ${r.coveredCells}`);
  });

  it('runs along the signed-off line (within 1 cm, @turf/point-to-line-distance) at its signed-off heights (within 1 cm at every station)', () => {
    for (const st of s.stretches) {
      const line = sim.plan.lines[st.line - 1];
      const axis = lineString([[line.start.lon, line.start.lat], [line.end.lon, line.end.lat]]);
      for (const p of [st.start, st.end]) expect(pointToLineDistance(point([p.lon, p.lat]), axis, { units: 'meters' })).toBeLessThan(0.01);
      expect(st.lengthM).toBeCloseTo(st.toM - st.fromM, 6);
      // legs tile the stretch without gaps
      expect(st.legs[0].fromM).toBeCloseTo(st.fromM, 6);
      expect(st.legs[st.legs.length - 1].toM).toBeCloseTo(st.toM, 6);
      for (let i = 1; i < st.legs.length; i++) expect(st.legs[i].fromM).toBeCloseTo(st.legs[i - 1].toM, 6);
      for (let p = st.firstPhoto; p <= st.lastPhoto; p++) {
        const station = line.stations[p - 1];
        expect(station.distanceM).toBeGreaterThanOrEqual(st.fromM - 1e-6);
        expect(station.distanceM).toBeLessThanOrEqual(st.toM + 1e-6);
        const leg = st.legs.find((g) => g.fromM <= station.distanceM + 1e-6 && g.toM >= station.distanceM - 1e-6)!;
        const t = leg.toM > leg.fromM ? (station.distanceM - leg.fromM) / (leg.toM - leg.fromM) : 0;
        expect(Math.abs(leg.altitudeStartAboveTakeoffM + t * (leg.altitudeEndAboveTakeoffM - leg.altitudeStartAboveTakeoffM) - station.altitudeAboveTakeoffM)).toBeLessThan(0.01);
        expect(Math.abs(leg.altitudeStartM + t * (leg.altitudeEndM - leg.altitudeStartM) - station.altitudeM)).toBeLessThan(0.01);
      }
    }
    expect(s.timeS).toBeCloseTo(s.lengthM / sim.mission.speedMps, 3);
    expect(s.photos).toBe(s.stretches.reduce((t, x) => t + x.photos, 0));
  });
});

describe('the as-flown map', () => {
  const sim = simulateFlight(SKIP);
  const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
  const asFlown = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, sim.photos, spec, SETTINGS);
  const r = planReflight(sim.site.grid, sim.missionInput, sim.mission, asFlown, spec, SETTINGS)!;
  const s = reflightStretches(sim.site.grid, sim.mission, asFlown, spec, SETTINGS);
  // the stretches' ends into the grid's CRS through proj4 itself (the npm package, not the engine's own wrapper)
  const toGrid = proj4('EPSG:4326', sim.site.grid.crs.proj4);
  const segments = s.stretches.map((st) => { const [x0, y0] = toGrid.forward([st.start.lon, st.start.lat]); const [x1, y1] = toGrid.forward([st.end.lon, st.end.lat]); return { x0, y0, x1, y1 }; });
  const map = asFlownMap(asFlown, spec, segments);
  const png = PNG.sync.read(Buffer.from(map.png));
  const colour = (x: number, y: number) => { const o = (y * png.width + x) * 4; return `#${[0, 1, 2].map((c) => png.data[o + c].toString(16).padStart(2, '0')).join('')}`; };
  const [meets, shortBoth, lost, stretch] = AS_FLOWN_MAP_LEGEND.map((l) => l.colour);

  it('draws each cell in its class, as the analysis classes it (every cell away from the stretch lines)', () => {
    const { cells } = asFlown.flown;
    const k = map.pxPerCell;
    expect(png.width).toBe(cells.width * k);
    let counted = 0;
    for (let row = 0; row < cells.height; row++) {
      for (let col = 0; col < cells.width; col++) {
        const i = row * cells.width + col;
        // a cell's pixels: all in its colour but the stripes; find a non-stripe, non-line pixel in it
        const px = [...Array(k * k).keys()].map((q) => [col * k + (q % k), row * k + Math.floor(q / k)]).map(([x, y]) => colour(x, y));
        if (px.includes(stretch)) continue;
        const want = !cells.inside[i] ? '#ffffff' : asFlown.difference.lost[i] ? lost : cellMeetsSpec(asFlown.flown, spec, i) ? meets : shortBoth;
        expect(px.some((c) => c === want)).toBe(true);
        counted++;
      }
    }
    expect(counted).toBeGreaterThan(0.9 * cells.width * cells.height);
    expect(asFlown.difference.lostCells).toBeGreaterThan(0);
  });

  it('draws the re-flight stretches where proj4 puts their ends', () => {
    const t = asFlown.flown.cells.transform, k = map.pxPerCell;
    for (const g of segments) {
      for (const [x, y] of [[g.x0, g.y0], [g.x1, g.y1]]) {
        const px = Math.round(((x - t[0]) / t[1]) * k), py = Math.round(((y - t[3]) / t[5]) * k);
        if (px < 0 || py < 0 || px >= png.width || py >= png.height) continue;
        expect(colour(px, py)).toBe(stretch);
      }
    }
  });
});
