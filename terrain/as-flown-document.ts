/**
 * One as-flown check and the document that reports it: the photos matched to the planned stations, the coverage of
 * their real poses next to the plan's on the same cells, the cells lost against the plan and the re-flight. The
 * command line prints this document and the server stores it with the check, so both say the same (the callers
 * add the cautions).
 */
import type { Grid } from './grid';
import { WGS84, createTransform } from './crs';
import { analysePlan } from './plan';
import { resolveMission } from './mission';
import { cellX, cellY, coverageLayout, gridCellM } from './coverage-grid';
import { resolveCoverageInput, type Compliance } from './coverage-spec';
import { analyseAsFlown } from './as-flown';
import type { FlownPhoto } from './as-flown-match';
import { MIN_REFLIGHT_PATCH_SHARE, planReflight } from './reflight';
import { reflightStretches } from './reflight-stretches';
import { AS_FLOWN_MAP_LEGEND, asFlownMap } from './as-flown-map';
import type { PlanResult } from './plan-result';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/** Compliance in the document's words (shares rounded). */
function complianceDoc(c: Compliance) {
  return {
    cellsInArea: c.cellsInArea, areaM2: round(c.areaM2, 1), shareAll: round(c.shareAll, 6),
    items: c.items.map((it) => ({ item: it.item, asks: it.asks, share: round(it.share, 6), failingAreaM2: round(it.failingAreaM2, 1) })),
  };
}

interface AsFlownCheckOptions {
  /** The grid's vertical datum (named in the document's height reference). */
  verticalDatum: { epsg: number | null; name: string } | null;
  /** Cell size asked for (metres); else the mission's coverage setting, else the grid's own resolution. */
  cellM?: number | null;
  /**
   * The plan the version flies, when it is not the mission's own `analysePlan` (a solved layout): the photos are
   * matched to its stations and the re-flight's stretches are cut from its lines.
   */
  plan?: PlanResult;
  /** Base64 encoder (the caller's: terrain/ has none of its own); when given, the document carries the as-flown map image. */
  base64?: (bytes: Uint8Array) => string;
}

/**
 * Check `photos` against the plan of `input` over `grid` (a window covering the mission). Throws TerrainError when
 * the mission or the raster size is refused, before any analysis.
 */
export function runAsFlownCheck(grid: Grid, input: Record<string, unknown>, photos: readonly FlownPhoto[], opts: AsFlownCheckOptions) {
  const mission = resolveMission(input);
  const { spec, settings } = resolveCoverageInput(input, mission);
  const ring = mission.area.coordinates[0];
  const meanLat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  const cellM = opts.cellM ?? settings.cellM ?? gridCellM(grid, meanLat);
  coverageLayout(grid, mission.area, cellM, settings.maxCells); // refuses an oversized raster before any analysis
  const rasterSettings = { cellM, maxCells: settings.maxCells, imageErrorPx: settings.imageErrorPx, occlusion: settings.occlusion };
  const analyseOpts = { verticalDatum: opts.verticalDatum };
  const t0 = performance.now();
  const plan = opts.plan ?? analysePlan(grid, input, { ...analyseOpts, mission });
  const t1 = performance.now();
  const a = analyseAsFlown(grid, mission, plan, photos, spec, rasterSettings);
  const t2 = performance.now();
  const reflight = planReflight(grid, input, mission, a, spec, rasterSettings, analyseOpts);
  const stretches = reflight === null ? null : reflightStretches(grid, mission, a, spec, rasterSettings);
  const t3 = performance.now();
  const toGrid = createTransform(WGS84, grid.crs);
  const map = opts.base64 ? asFlownMap(a, spec, (stretches?.stretches ?? []).map((st) => {
    const [x0, y0] = toGrid.forward(st.start.lon, st.start.lat), [x1, y1] = toGrid.forward(st.end.lon, st.end.lat);
    return { x0, y0, x1, y1 };
  })) : null;
  const toLonLat = createTransform(grid.crs, WGS84);
  const ll = (x: number, y: number) => { const [lon, lat] = a.frame.toLonLat(x, y); return { lon: round(lon, 7), lat: round(lat, 7) }; };
  const { cells } = a.flown;
  const datumName = opts.verticalDatum ? opts.verticalDatum.name : 'the grid\'s vertical datum (not stated in the file)';
  const m = a.match;
  return {
    heights: {
      datum: datumName,
      reference: `Altitudes and altitude errors are metres above ${datumName}.`,
      conversions: 'altitudeRef datum: as logged; ellipsoid: less the EGM96 geoid undulation there (EGM96 taken as the grid\'s datum: exact for EGM96 grids, a few decimetres off for national datums); takeoff: plus the grid\'s ground at the takeoff point'
        + ` (${round(plan.takeoff.groundM, 2)} m). EXIF GPSAltitude is above sea level and is read as datum.`,
    },
    photos: {
      count: photos.length,
      attitudeAssumed: a.assumedAttitude.map((k) => photos[k].file),
      attitudeNote: a.assumedAttitude.length ? `${a.assumedAttitude.length} photo${a.assumedAttitude.length > 1 ? 's state' : ' states'} no camera attitude: looking straight down assumed, along the matched line's heading (the plan's heading when unmatched).` : null,
      leftOutFarAway: a.farAway.map((k) => photos[k].file),
    },
    matching: {
      limits: m.limits,
      matched: m.matched.length,
      missed: m.missed,
      extra: m.extra,
      lines: m.lines,
      camera: m.camera,
      photos: m.matched,
    },
    spec: { ...spec, basis: 'as flown from the photos\' poses and as planned from the stations, both without an attitude envelope' },
    raster: { width: cells.width, height: cells.height, cellM: round(cells.cellM, 4), cellAreaM2: round(cells.cellAreaM2, 4), crs: { epsg: grid.crs.epsg, name: grid.crs.name } },
    planned: complianceDoc(a.compliance.planned),
    flown: complianceDoc(a.compliance.flown),
    patchCount: a.compliance.flown.patches.length,
    patches: a.compliance.flown.patches.slice(0, 100).map((p) => {
      const [lon, lat] = toLonLat.forward(p.centroidX, p.centroidY);
      return { reason: p.reason, message: p.message, cells: p.cells, areaM2: round(p.areaM2, 1), centroid: { lon: round(lon, 7), lat: round(lat, 7) }, worst: p.worst === null ? null : round(p.worst, 4) };
    }),
    difference: {
      lostCells: a.difference.lostCells, lostAreaM2: round(a.difference.lostAreaM2, 1),
      gainedCells: a.difference.gainedCells, gainedAreaM2: round(a.difference.gainedAreaM2, 1),
      failingAsPlannedCells: a.difference.failingAsPlannedCells,
      note: 'lost: cells meeting the whole spec as planned but not as flown; failing as planned too: a re-flight of the same plan would not mend them (change the plan)',
      patches: a.difference.lostPatches.slice(0, 100).map((p) => {
        let sx = 0, sy = 0;
        for (const i of p) { sx += cellX(cells, i); sy += cellY(cells, i); }
        return { cells: p.length, areaM2: round(p.length * cells.cellAreaM2, 1), centroid: ll(sx / p.length, sy / p.length) };
      }),
    },
    reflight: reflight === null ? null : {
      covers: reflight.areas.length === 0 ? 'Nothing to re-fly: every lost patch is smaller than the re-flight threshold.' : `${reflight.coveredCells} of the ${reflight.targetCells} lost cells in patches worth re-flying meet the whole spec with the re-flight's photos added to those taken; the whole area then meets it on ${round(reflight.shareAllAfter * 100, 2)} %.`,
      targetCells: reflight.targetCells, coveredCells: reflight.coveredCells, shareAllAfter: round(reflight.shareAllAfter, 6),
      lineCount: reflight.lineCount, photoCount: reflight.photoCount, lineLengthM: round(reflight.lineLengthM, 1), flightTimeS: round(reflight.flightTimeS, 1),
      extraLinesEachSide: reflight.extraLines,
      smallPatchCells: reflight.smallPatchCells,
      smallPatches: `${reflight.smallPatchCells} lost cells lie in patches smaller than ${MIN_REFLIGHT_PATCH_SHARE} of one station's ground (air base × line spacing) and are not re-flown; they are listed under difference.patches.`,
      areas: reflight.areas.map((ar) => ({ patches: ar.patches, cells: ar.cells, areaM2: round(ar.areaM2, 1), alongM: round(ar.alongM, 1), acrossM: round(ar.acrossM, 1), polygon: ar.polygon })),
      missions: reflight.missions,
      stretches: stretches === null ? undefined : {
        note: 'Every station of the signed-off lines whose photo sees ground the flight lost, taken again along its own line at the signed-off heights (runs of such stations with up to two others between them fly as one stretch, from half a photo spacing before the first to half after the last): it can be flown the same day, and it gives that ground back every view the plan gave it.',
        targetCells: stretches.targetCells, coveredCells: stretches.coveredCells, neededStations: stretches.neededStations,
        lengthM: round(stretches.lengthM, 1), timeS: round(stretches.timeS, 1), photos: stretches.photos,
        items: stretches.stretches.map((st) => ({
          line: st.line, fromM: round(st.fromM, 3), toM: round(st.toM, 3), lengthM: round(st.lengthM, 3), headingDeg: round(st.headingDeg, 1),
          start: { lon: round(st.start.lon, 7), lat: round(st.start.lat, 7) }, end: { lon: round(st.end.lon, 7), lat: round(st.end.lat, 7) },
          firstPhoto: st.firstPhoto, lastPhoto: st.lastPhoto, photos: st.photos, timeS: round(st.timeS, 1),
          legs: st.legs.map((g) => ({ fromM: round(g.fromM, 3), toM: round(g.toM, 3), altitudeStartAboveTakeoffM: round(g.altitudeStartAboveTakeoffM, 3), altitudeEndAboveTakeoffM: round(g.altitudeEndAboveTakeoffM, 3), altitudeStartM: round(g.altitudeStartM, 3), altitudeEndM: round(g.altitudeEndM, 3) })),
        })),
      },
      lines: reflight.plans.map((p) => p.lines.map((l) => ({ start: l.start, end: l.end, lengthM: l.lengthM, headingDeg: l.headingDeg, photos: l.stations.length, legs: l.legs.map((g) => ({ startDistanceM: g.start.distanceM, endDistanceM: g.end.distanceM, altitudeStartAboveTakeoffM: g.altitudeStartAboveTakeoffM, altitudeEndAboveTakeoffM: g.altitudeEndAboveTakeoffM, altitudeStartM: g.altitudeStartM, altitudeEndM: g.altitudeEndM })) }))),
    },
    map: map === null || !opts.base64 ? undefined : {
      widthPx: map.widthPx, heightPx: map.heightPx, pxPerCell: map.pxPerCell, cellM: round(cells.cellM, 4),
      note: `North up; each ${round(cells.cellM, 2)} m cell drawn as ${map.pxPerCell} × ${map.pxPerCell} pixels; white outside the survey area.`,
      legend: AS_FLOWN_MAP_LEGEND.map((l) => ({ colour: l.colour, name: l.name, words: l.words })),
      pngBase64: opts.base64(map.png),
    },
    timingMs: { plan: round(t1 - t0, 1), asFlown: round(t2 - t1, 1), reflight: round(t3 - t2, 1) },
  };
}

/** The as-flown document (contracts/as-flown.ts asFlownDocSchema is its zod shape, with the cautions added). */
export type AsFlownCheckDocument = ReturnType<typeof runAsFlownCheck>;
