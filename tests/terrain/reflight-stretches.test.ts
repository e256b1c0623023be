import { describe, expect, it } from 'vitest';
import { booleanPointInPolygon, point, polygon, lineString, pointToLineDistance, polygonToLine } from '@turf/turf';
import { simulateFlight } from './as-flown-flight';
import { analyseAsFlown, cellMeetsSpec } from '../../terrain/as-flown';
import { resolveCoverageInput } from '../../terrain/coverage-spec';
import { planReflight } from '../../terrain/reflight';
import { reflightStretches } from '../../terrain/reflight-stretches';
import { AS_FLOWN_MAP_LEGEND, asFlownMap } from '../../terrain/as-flown-map';
import proj4 from 'proj4';
import pngjs from 'pngjs';

const { PNG } = pngjs;

// The same simulated flight as the as-flown tests: six skipped triggers in a row on line 2 and one on line 4.
const SKIP = [7, 8, 9, 10, 11, 12].map((station) => ({ line: 2, station })).concat([{ line: 4, station: 6 }]);
const SETTINGS = { cellM: 2, maxCells: 4_000_000, imageErrorPx: 0.5, occlusion: true };

describe('re-flight as stretches of the signed-off lines', () => {
  const sim = simulateFlight(SKIP);
  const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
  const asFlown = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, sim.photos, spec, SETTINGS);
  const r = planReflight(sim.site.grid, sim.missionInput, sim.mission, asFlown, spec, SETTINGS)!;
  const s = reflightStretches(sim.plan, asFlown.frame, r.areas, sim.mission.speedMps);

  it('takes exactly the signed-off stations inside each re-flight area (point in polygon by @turf/boolean-point-in-polygon 7)', () => {
    expect(s.stretches.length).toBeGreaterThan(0);
    r.areas.forEach((area, k) => {
      const poly = polygon(area.polygon.coordinates);
      const edge = polygonToLine(poly);
      // the stations @turf puts inside the area, leaving out the few within 0.5 m of its edge (where the
      // straight edge in longitude/latitude and the straight edge in the local frame may part by millimetres)
      const want = new Set<string>();
      const clear = (lon: number, lat: number) => pointToLineDistance(point([lon, lat]), edge as never, { units: 'meters' }) > 0.5;
      sim.plan.lines.forEach((line, li) => line.stations.forEach((st, si) => {
        if (clear(st.lon, st.lat) && booleanPointInPolygon(point([st.lon, st.lat]), poly)) want.add(`${li + 1}:${si + 1}`);
      }));
      const got = new Set<string>();
      for (const st of s.stretches.filter((x) => x.area === k + 1)) {
        if (st.firstPhoto === null) continue;
        for (let p = st.firstPhoto; p <= st.lastPhoto!; p++) {
          const station = sim.plan.lines[st.line - 1].stations[p - 1];
          if (clear(station.lon, station.lat)) got.add(`${st.line}:${p}`);
        }
      }
      expect([...got].sort()).toEqual([...want].sort());
    });
    // a stretch longer than the distance between photos holds photos
    for (const st of s.stretches) if (st.lengthM > sim.plan.summary.triggerDistanceM) expect(st.photos).toBeGreaterThan(0);
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
      if (st.firstPhoto === null) continue;
      for (let p = st.firstPhoto; p <= st.lastPhoto!; p++) {
        const station = line.stations[p - 1];
        const leg = st.legs.find((g) => g.fromM <= station.distanceM + 1e-6 && g.toM >= station.distanceM - 1e-6)!;
        const t = leg.toM > leg.fromM ? (station.distanceM - leg.fromM) / (leg.toM - leg.fromM) : 0;
        expect(Math.abs(leg.altitudeStartAboveTakeoffM + t * (leg.altitudeEndAboveTakeoffM - leg.altitudeStartAboveTakeoffM) - station.altitudeAboveTakeoffM)).toBeLessThan(0.01);
        expect(Math.abs(leg.altitudeStartM + t * (leg.altitudeEndM - leg.altitudeStartM) - station.altitudeM)).toBeLessThan(0.01);
      }
    }
  });

  it('counts the lines a re-flight area adds beyond the plan, which the signed-off sheet cannot fly', () => {
    const positions = r.areas.reduce((t, a) => t + Math.round(a.acrossM / sim.plan.summary.lineSpacingM), 0);
    const lines = new Set(s.stretches.map((x) => `${x.area}:${x.line}`)).size;
    expect(s.offPlanLines).toBe(positions - lines);
    expect(s.photos).toBe(s.stretches.reduce((t, x) => t + x.photos, 0));
    // time on the stretches at the mission's speed
    expect(s.timeS).toBeCloseTo(s.lengthM / sim.mission.speedMps, 3);
  });
});

describe('the as-flown map', () => {
  const sim = simulateFlight(SKIP);
  const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
  const asFlown = analyseAsFlown(sim.site.grid, sim.mission, sim.plan, sim.photos, spec, SETTINGS);
  const r = planReflight(sim.site.grid, sim.missionInput, sim.mission, asFlown, spec, SETTINGS)!;
  const s = reflightStretches(sim.plan, asFlown.frame, r.areas, sim.mission.speedMps);
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
