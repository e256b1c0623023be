import { describe, expect, it } from 'vitest';
import { cellX, cellY } from '../../terrain/coverage-grid';
import { simulateFlight, type SimulatedFlight } from './as-flown-flight';
import { analyseAsFlown, maskPatches, type AsFlown } from '../../terrain/as-flown';
import { cellMeetsSpec } from '../../terrain/coverage-spec';
import { altitudeInGridDatumM, matchPhotos, plannedAltitudeAtM } from '../../terrain/as-flown-match';
import { computeCoverage } from '../../terrain/coverage';
import { resolveCoverageInput, type CoverageSpec } from '../../terrain/coverage-spec';
import { planReflight } from '../../terrain/reflight';
import { analysePlan } from '../../terrain/plan';

// Skipped triggers of the simulated flight: six in a row on line 2 (a gap longer than a footprint) and one on line 4.
const SKIP = [7, 8, 9, 10, 11, 12].map((station) => ({ line: 2, station })).concat([{ line: 4, station: 6 }]);
const SETTINGS = { cellM: 2, maxCells: 4_000_000, imageErrorPx: 0.5, occlusion: true };

let cached: { sim: SimulatedFlight; spec: CoverageSpec; asFlown: AsFlown } | null = null;
function flight() {
  if (!cached) {
    const sim = simulateFlight(SKIP);
    const { spec } = resolveCoverageInput(sim.missionInput, sim.mission);
    cached = { sim, spec, asFlown: analyseAsFlown(sim.site.grid, sim.mission, sim.plan, sim.photos, spec, SETTINGS) };
  }
  return cached;
}

describe('as-flown matching of photos to planned stations', () => {
  it('finds exactly the skipped triggers and the two photos taken off the lines', () => {
    // ground truth: the simulation's own list of skipped triggers and extra photos
    const { sim, asFlown } = flight();
    const m = asFlown.match;
    expect(m.missed.map((t) => ({ line: t.line, station: t.station }))).toEqual(SKIP);
    expect(m.extra.map((e) => e.photo).sort((a, b) => a - b)).toEqual(sim.extraPhotos);
    expect(m.extra.every((e) => e.reason === 'off-lines')).toBe(true);
    expect(m.matched).toHaveLength(sim.photos.length - sim.extraPhotos.length);
    // each photo went to its own station: the file number is the station's place in the flight
    const perLine = sim.plan.lines.map((l) => l.stations.length);
    for (const p of m.matched) {
      const k = perLine.slice(0, p.line - 1).reduce((t, n) => t + n, 0) + p.station;
      expect(p.file).toBe(`IMG_${String(k).padStart(4, '0')}.JPG`);
      expect(Math.abs(p.alongErrorM)).toBeLessThanOrEqual(1.5 + 1e-6);
    }
  });

  it('reports each line\'s drift across track, flags the line pushed off, and the altitude bias', () => {
    // ground truth: the drift and the barometer bias the simulation applied (±0.4 m and ±0.5 m scatter on top)
    const { sim, asFlown } = flight();
    for (const l of asFlown.match.lines) {
      expect(l.crossTrackMeanM!).toBeCloseTo(sim.driftM[l.line - 1], 0);
      expect(l.offTrack).toBe(l.line === 3);
      expect(Math.abs(l.altitudeErrorMeanM! - sim.altitudeBiasM)).toBeLessThan(0.3);
      expect(l.missed).toBe(SKIP.filter((s) => s.line === l.line).length);
    }
    expect(asFlown.match.limits.offTrackM).toBeCloseTo(0.05 * sim.plan.summary.footprintAcrossM, 3);
  });

  it('converts ellipsoidal and above-takeoff altitudes into the grid datum before comparing with the legs', () => {
    // PROJ 9.1.1 with Debian's egm96_15.gtx (NGA's 15' EGM96 grid):
    //   echo '46.7691 4.4812 600' | cs2cs -d 4 EPSG:4979 +to EPSG:4326+5773   ->   46.7691 4.4812 551.3204
    const ell = altitudeInGridDatumM({ lon: 4.4812, lat: 46.7691, altitudeM: 600, altitudeRef: 'ellipsoid' }, 0);
    expect(Math.abs(ell - 551.3204)).toBeLessThan(0.02);
    const { sim } = flight();
    const p = sim.photos[5];
    expect(altitudeInGridDatumM({ ...p, altitudeRef: 'takeoff', altitudeM: p.altitudeM - sim.plan.takeoff.groundM }, sim.plan.takeoff.groundM)).toBeCloseTo(p.altitudeM, 9);
    expect(altitudeInGridDatumM(p, 1e6)).toBe(p.altitudeM);
    // the same flight logged against takeoff matches the same way, with the same altitude errors
    const rel = sim.photos.map((q) => ({ ...q, altitudeRef: 'takeoff' as const, altitudeM: q.altitudeM - sim.plan.takeoff.groundM }));
    const a = matchPhotos(sim.plan, flight().asFlown.frame, rel, sim.mission.camera);
    expect(a.matched.map((q) => q.altitudeErrorM)).toEqual(flight().asFlown.match.matched.map((q) => q.altitudeErrorM));
  });

  it('takes one photo per station: a second trigger at a station is an extra photo, and a clock out of order is counted', () => {
    // ground truth: the duplicate and the swapped times made here
    const { sim, asFlown } = flight();
    const k = 20;
    const dup = { ...sim.photos[k], file: 'IMG_DUP.JPG', lon: sim.photos[k].lon + 1e-6 };
    const swapped = sim.photos.map((p, i) => (i === 40 ? { ...p, time: sim.photos[41].time } : i === 41 ? { ...p, time: sim.photos[40].time } : p));
    const m = matchPhotos(sim.plan, asFlown.frame, [...swapped, dup], sim.mission.camera);
    expect(m.missed).toEqual(asFlown.match.missed);
    const extra = m.extra.find((e) => e.reason === 'no-station-near')!;
    expect([sim.photos[k].file, 'IMG_DUP.JPG']).toContain(extra.file);
    expect(m.extra).toHaveLength(3);
    const line40 = asFlown.match.matched.find((q) => q.photo === 40)!.line;
    expect(asFlown.match.matched.find((q) => q.photo === 41)!.line).toBe(line40);
    expect(m.lines.map((l) => l.outOfOrder)).toEqual(m.lines.map((l) => (l.line === line40 ? 1 : 0)));
    expect(asFlown.match.lines.every((l) => l.outOfOrder === 0)).toBe(true);
  });

  it('reads the planned altitude along a line from its legs', () => {
    // reference: the plan's own station altitudes (sampled from the same legs by analysePlan)
    const { sim } = flight();
    const line = sim.plan.lines[0];
    for (const s of line.stations) expect(Math.abs(plannedAltitudeAtM(line, s.distanceM) - s.altitudeM)).toBeLessThan(0.01);
  });

  it('flags photos at another focal length and a second camera model', () => {
    // ground truth: the one photo changed here (10.3 mm is the other 1-inch preset's lens)
    const { sim, asFlown } = flight();
    const photos = sim.photos.map((p, k) => (k === 10 ? { ...p, focalLengthMm: 10.3, cameraModel: 'Other Cam' } : p));
    const m = matchPhotos(sim.plan, asFlown.frame, photos, sim.mission.camera);
    expect(m.camera.focalMismatch.map((f) => f.photo)).toEqual([10]);
    expect(m.camera.models).toEqual(['Other Cam', 'Synthetic Survey Camera']);
    expect(m.camera.messages.join(' ')).toMatch(/1 photo was taken at a focal length other than the plan's 8.8 mm \(10.3 mm\).*2 camera models/);
  });
});

describe('as-flown coverage', () => {
  it('is the coverage of the photos\' real poses: the raster rebuilt from the simulation without the skipped photos', () => {
    // ground truth: the poses the simulation flew (the log's rounding included)
    const { sim, spec, asFlown } = flight();
    const direct = computeCoverage(sim.site.grid, asFlown.frame, sim.mission.area, sim.mission.camera, sim.allPoses.filter((_, i) => !sim.skippedPose[i]), {
      cellM: 2, specGsdCm: spec.maxGsdCm, envelope: null,
    });
    expect(asFlown.flown.views).toEqual(direct.views);
    // the GSD's ground slope comes from a height lattice spanning the cells and the cameras, so the two photos
    // off the lines shift its nodes: the finest GSD agrees to a thousandth of a centimetre, not bit for bit
    let worst = 0;
    for (let i = 0; i < direct.finestGsdCm.length; i++) if (direct.cells.inside[i]) worst = Math.max(worst, Math.abs(asFlown.flown.finestGsdCm[i] - direct.finestGsdCm[i]));
    expect(worst).toBeLessThan(1e-3);
  });

  it('shows the patch the skipped triggers leave, known from the simulation with and without those photos', () => {
    const { sim, spec, asFlown } = flight();
    const o = { cellM: 2, specGsdCm: spec.maxGsdCm, envelope: null };
    const all = computeCoverage(sim.site.grid, asFlown.frame, sim.mission.area, sim.mission.camera, sim.allPoses, o);
    const c = all.cells;
    const known = new Uint8Array(c.width * c.height);
    for (let i = 0; i < known.length; i++) if (c.inside[i] && cellMeetsSpec(all, spec, i) && !cellMeetsSpec(asFlown.flown, spec, i)) known[i] = 1;
    const patches = maskPatches(known, c.width, c.height);
    // the six-photo gap leaves one large patch; the single skip on line 4 leaves nothing (80 % forward overlap)
    expect(patches[0].length).toBeGreaterThan(100);
    let sx = 0, sy = 0;
    for (const i of patches[0]) { sx += cellX(c, i); sy += cellY(c, i); }
    const gap = sim.allPoses.filter((_, i) => sim.skippedPose[i]).slice(0, 6);
    const gx = gap.reduce((t, p) => t + p.xM, 0) / 6, gy = gap[0].yM;
    // it lies under the gap: centred along it, between line 2 and the area's south edge (y = −100)
    expect(Math.abs(sx / patches[0].length - gx)).toBeLessThan(20);
    expect(sy / patches[0].length).toBeLessThan(gy);
    const line4 = sim.allPoses.filter((_, i) => sim.skippedPose[i])[6];
    for (const p of patches) for (const i of p) expect(Math.hypot(cellX(c, i) - line4.xM, cellY(c, i) - line4.yM)).toBeGreaterThan(40);
    // every cell of it fails as flown, and the compliance names a views patch there
    for (const i of patches[0]) expect(asFlown.flown.views[i]).toBeLessThan(spec.minViews);
    const viewsPatches = asFlown.compliance.flown.patches.filter((p) => p.reason === 'views');
    expect(viewsPatches.some((p) => p.cells >= patches[0].length)).toBe(true);
    // and it is in the planned-vs-flown difference where the plan met the spec
    let inDiff = 0, metPlanned = 0;
    for (const i of patches[0]) { if (cellMeetsSpec(asFlown.planned, spec, i)) { metPlanned++; if (asFlown.difference.lost[i]) inDiff++; } }
    expect(inDiff).toBe(metPlanned);
    expect(metPlanned).toBeGreaterThan(100);
  });

  it('assumes nadir along the line for a photo without attitude and says which', () => {
    const { sim, asFlown } = flight();
    expect(asFlown.assumedAttitude).toEqual([sim.extraPhotos[1]]);
    // the photo in the turn is beyond every line's end: it takes the plan's heading, looking straight down
    const pose = asFlown.poses[sim.extraPhotos[1]];
    expect([pose.yawDeg, pose.rollDeg, pose.mountTiltDeg]).toEqual([sim.plan.summary.headingDeg, 0, 0]);
  });
});

describe('re-flight of the lost ground', () => {
  it('proposes missions the plan analysis takes whose photos, added to those taken, mend every lost cell', () => {
    // what "mends" means is the coverage engine's own verdict (computeCoverage, itself checked against GDAL's
    // rasterisation in coverage-gdal.test.ts) on the photos taken plus the re-flight's planned stations
    const { sim, spec, asFlown } = flight();
    const t0 = performance.now();
    const r = planReflight(sim.site.grid, sim.missionInput, sim.mission, asFlown, spec, SETTINGS)!;
    const ms = performance.now() - t0;
    expect(r).not.toBeNull();
    expect(r.targetCells + r.smallPatchCells).toBe(asFlown.difference.lostCells);
    expect(r.targetCells).toBeGreaterThan(100);
    expect(r.coveredCells).toBe(r.targetCells);
    // fewer photos than flying the plan again
    expect(r.photoCount).toBeLessThan(sim.plan.summary.photoCount);
    // each area spans whole line positions of the plan: its width across is a whole number of spacings
    for (const a of r.areas) expect(a.acrossM / sim.plan.summary.lineSpacingM).toBeCloseTo(Math.round(a.acrossM / sim.plan.summary.lineSpacingM), 2);
    // the gap's patch (under line 2, south of the area's middle) lies inside one of the re-flight areas
    const gapArea = r.areas.filter((a) => a.polygon.coordinates[0].some(([lon, lat]) => asFlown.frame.toLocal(lon, lat)[1] < -40));
    expect(gapArea.length).toBeGreaterThan(0);
    // each mission is complete: analysed again it gives the same plan, flown along the plan's heading
    r.missions.forEach((m, k) => {
      const again = analysePlan(sim.site.grid, JSON.parse(JSON.stringify(m)));
      expect(again.summary.photoCount).toBe(r.plans[k].summary.photoCount);
      expect(again.summary.headingDeg).toBe(sim.plan.summary.headingDeg);
      expect(m.camera).toEqual(sim.missionInput.camera);
    });
    console.log(`re-flight of ${r.targetCells} lost cells: ${r.areas.length} areas (${r.areas.map((a) => `${a.alongM.toFixed(0)} x ${a.acrossM.toFixed(0)} m`).join(', ')}), extra lines each side ${r.extraLines.join(",")}, ${r.smallPatchCells} cells in small patches left, ${r.lineCount} lines, ${r.lineLengthM.toFixed(0)} m, ${r.photoCount} photos, ${ms.toFixed(0)} ms`);
  });

  it('proposes nothing when nothing was lost', () => {
    // ground truth: a "flight" that is the plan's own stations loses nothing by construction
    const { spec } = flight();
    const full = simulateFlight([]);
    const a = analyseAsFlown(full.site.grid, full.mission, full.plan, full.photos.filter((_, k) => !full.extraPhotos.includes(k)), spec, { ...SETTINGS, occlusion: false });
    expect(a.match.missed).toEqual([]);
    expect(a.match.extra).toEqual([]);
    // the drift alone may cost edge cells; with the plan itself as the flight nothing is lost
    const asPlanned = full.plan.lines.flatMap((l) => l.stations.map((s, i) => ({ file: `P${l.index}-${i}`, lon: s.lon, lat: s.lat, altitudeM: s.altitudeM, altitudeRef: 'datum' as const, yawDeg: l.headingDeg, pitchDeg: 0, rollDeg: 0, time: '2026-05-14T09:30:00Z' })));
    const b = analyseAsFlown(full.site.grid, full.mission, full.plan, asPlanned, spec, SETTINGS);
    expect(b.difference.lostCells).toBe(0);
    expect(planReflight(full.site.grid, full.missionInput, full.mission, b, spec, SETTINGS)).toBeNull();
  });
});
