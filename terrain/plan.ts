/** The whole mission analysis over a grid: lines, stations, overlaps, altitude legs, estimates and warnings (CLI `plan`, worker and API). */
import type { Grid } from './grid';
import { TerrainError, check } from './errors';
import { footprintM, gsdBandCm, heightForGsdM, airBaseM, lineSpacingM } from './gsd';
import { pixelPitchMm } from './camera';
import { METRES_PER_FOOT, METRES_PER_US_SURVEY_FOOT } from './length-units';
import { resolveMission, type Mission } from './mission';
import { localFrameFor, localHeights, type LocalFrame } from './local-frame';
import { planFlightLines, polygonToLocal, pointAlong, type FlightLine } from './lines';
import { fitAltitudes, type AltitudeLimits } from './altitude';
import { lineLengthWords, unmetByReasonWords } from './unmet-words';
import { stationHeights, stationOverlaps, type StationResult } from './overlap';
import { envelopeWords, guaranteedExtents, lineCrabDeg } from './overlap-envelope';
import { resolveCoverageInput } from './coverage-spec';
import type { AttitudeEnvelope } from './attitude-envelope';
import { adviseHeading } from './heading';
import { estimateMission } from './estimates';
import { geoidUndulationM } from './heights';
import { planSafetyWarnings, transitShortfallM, transitWarnings, type PlanWarning } from './plan-warnings';
import type { PlanLeg, PlanLine, PlanPoint, PlanResult, PlanStation, PlanSummary } from './plan-result';

export type { PlanWarning } from './plan-warnings';
export type { PlanPoint, PlanStation, PlanLeg, PlanLine, PlanSummary, PlanResult } from './plan-result';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };
const orNull = (v: number) => (Number.isFinite(v) ? v : null);

/** Ground-profile step from the grid's pixel size (metres), clamped to 1..10 m. */
export function autoStepM(grid: Grid, latDeg: number): number {
  const t = grid.transform;
  let dx = Math.hypot(t[1], t[4]);
  let dy = Math.hypot(t[2], t[5]);
  if (grid.crs.geographic) { dx *= 111_320 * Math.cos((latDeg * Math.PI) / 180); dy *= 110_574; }
  else if (grid.crs.horizontalUnit === 'foot') { dx *= METRES_PER_FOOT; dy *= METRES_PER_FOOT; }
  else if (grid.crs.horizontalUnit === 'us-survey-foot') { dx *= METRES_PER_US_SURVEY_FOOT; dy *= METRES_PER_US_SURVEY_FOOT; }
  return Math.min(10, Math.max(1, Math.min(dx, dy)));
}

/**
 * WGS 84 bbox [minLon, minLat, maxLon, maxLat] of the grid a mission needs: its area and takeoff point,
 * widened by the run-in, an air base and the largest footprint at the height limit (so a reader can decode
 * only the tiles under it).
 */
export function missionBboxWgs84(input: unknown): [number, number, number, number] {
  const m = resolveMission(input);
  let lo0 = m.takeoff.lon, la0 = m.takeoff.lat, lo1 = lo0, la1 = la0;
  for (const [lon, lat] of m.area.coordinates[0]) { lo0 = Math.min(lo0, lon); lo1 = Math.max(lo1, lon); la0 = Math.min(la0, lat); la1 = Math.max(la1, lat); }
  const fp = footprintM(m.camera, m.maxAglM);
  // the solver may lay lines beyond the boundary (solve.beyondEdgeM, checked there): the window takes them in
  const solve = (input as { solve?: { beyondEdgeM?: unknown } }).solve;
  const beyondM = typeof solve?.beyondEdgeM === 'number' && Number.isFinite(solve.beyondEdgeM) ? Math.min(100, Math.max(0, solve.beyondEdgeM)) : 0;
  const marginM = m.runInM + Math.max(fp.acrossM, fp.alongM) * 1.5 + 50 + beyondM;
  const dLat = marginM / 110_574;
  const dLon = marginM / (111_320 * Math.max(0.05, Math.cos((((la0 + la1) / 2) * Math.PI) / 180)));
  return [lo0 - dLon, la0 - dLat, lo1 + dLon, la1 + dLat];
}

function centroid(ring: number[][]): [number, number] {
  let x = 0, y = 0;
  const n = ring.length - 1;
  for (let i = 0; i < n; i++) { x += ring[i][0]; y += ring[i][1]; }
  return [x / n, y / n];
}

/** Distances along a line: every `stepM` plus the stations, sorted; with each station's index in it. */
export function profileDistances(line: FlightLine, stepM: number): { x: Float64Array; stationIdx: Int32Array } {
  const n = Math.max(2, Math.ceil(line.lengthM / stepM) + 1);
  const all: number[] = [];
  for (let i = 0; i < n; i++) all.push(Math.min(line.lengthM, (line.lengthM * i) / (n - 1)));
  for (const s of line.stationsM) all.push(s);
  all.sort((a, b) => a - b);
  const x: number[] = [];
  for (const v of all) if (x.length === 0 || v - x[x.length - 1] > 1e-6) x.push(v);
  const xs = Float64Array.from(x);
  const stationIdx = new Int32Array(line.stationsM.length);
  let j = 0;
  for (let s = 0; s < line.stationsM.length; s++) {
    while (j < xs.length - 1 && xs[j] < line.stationsM[s] - 1e-6) j++;
    stationIdx[s] = j;
  }
  return { x: xs, stationIdx };
}

/**
 * A leg shorter than the shortest-leg setting is never shown without saying why: the line itself is that
 * short, or the leg is a climb/descent at the gradient limit joining two levels, or a level stretch that the
 * climbs and descents around it (bounded by clearance and the gradient limits) cut short.
 */
export function shortLegWarnings(lineIndex: number, lineLengthM: number, legs: ReadonlyArray<PlanLeg>, minLegLengthM: number): PlanWarning[] {
  const out: PlanWarning[] = [];
  legs.forEach((g, k) => {
    const lengthM = g.end.distanceM - g.start.distanceM;
    if (!(lengthM < minLegLengthM - 1e-3)) return;
    const dz = g.altitudeEndM - g.altitudeStartM;
    const why = lineLengthM < minLegLengthM - 1e-3
      ? `the whole line is only ${round(lineLengthM, 1)} m long`
      : Math.abs(dz) > 1e-6
        ? `it is the ${dz > 0 ? 'climb' : 'descent'} of ${round(Math.abs(dz), 1)} m between two levels, at the ${dz > 0 ? 'climb' : 'descent'} limit; a longer one would leave the clearance or the GSD band`
        : 'it is a level stretch between a climb and a descent that clearance and the climb/descent limits cannot move apart';
    out.push({ code: 'short-leg', message: `Line ${lineIndex + 1}, leg ${k + 1} is ${round(lengthM, 1)} m long, shorter than the ${minLegLengthM} m shortest-leg setting: ${why}.` });
  });
  return out;
}

/** What the caller knows about the grid beyond the Grid itself (from the GeoTIFF header). */
export interface AnalyseOptions {
  verticalDatum?: { epsg: number | null; name: string } | null;
  /**
   * The mission as the caller already resolved it from this very input (`resolveMission(missionInput)`), so it is
   * not parsed and checked a second time; left out, the input is resolved here.
   */
  mission?: Mission;
  /**
   * Lines laid out by the caller (local frame of `localFrameFor` at the area's corner mean, flying order, stations
   * placed) instead of the uniform layout; the mission's heading must then be a number (their layout heading).
   */
  lines?: FlightLine[];
  /** Altitude limits of one line instead of the mission's (e.g. its own GSD height and slower, steeper legs). */
  limitsFor?: (line: FlightLine, missionLimits: AltitudeLimits) => AltitudeLimits;
  /** Ground the GSD band of a line is measured from at its sample distances (e.g. the lowest its photos reach); default the ground under it. */
  bandGroundFor?: (line: FlightLine, x: Float64Array) => Float64Array | undefined;
  /**
   * false: leave every overlap out (stations' and summary's overlaps null, no overlap flags). Lines, stations,
   * legs, GSDs and the flight time are the same; for analyses whose overlaps nobody reads (the solver's candidate
   * layouts and yardsticks), where casting every footprint, under every attitude of the envelope, is most of the
   * work. Default true.
   */
  overlaps?: boolean;
}

/** The mission over the grid: the local frame, its heights, the area, the photo geometry and the takeoff point. */
interface PlanGround {
  frame: LocalFrame;
  heights: ReturnType<typeof localHeights>;
  area: ReturnType<typeof polygonToLocal>;
  /** The height above ground that gives the target GSD, and the line spacing, air base and footprint there. */
  targetHeightM: number;
  spacingM: number;
  baseM: number;
  footprint: { acrossM: number; alongM: number };
  stepM: number;
  takeoffXY: [number, number];
  takeoffGroundM: number;
}

function planGround(grid: Grid, mission: Mission): PlanGround {
  const cam = mission.camera;
  const [cLon, cLat] = centroid(mission.area.coordinates[0]);
  const frame: LocalFrame = localFrameFor(cLon, cLat);
  const heights = localHeights(grid, frame);
  const area = polygonToLocal(mission.area as never, frame.toLocal);
  const H = heightForGsdM(cam, mission.targetGsdCm);
  const spacingM = lineSpacingM(cam, H, mission.sideOverlap);
  const baseM = airBaseM(cam, H, mission.forwardOverlap);
  const footprint = footprintM(cam, H);
  const stepM = mission.stationStepM ?? autoStepM(grid, cLat);
  const takeoffXY = frame.toLocal(mission.takeoff.lon, mission.takeoff.lat);
  const takeoffGroundM = heights.heightAt(takeoffXY[0], takeoffXY[1]);
  if (!Number.isFinite(takeoffGroundM)) {
    throw new TerrainError('outside-grid', `The takeoff point (${mission.takeoff.lon}, ${mission.takeoff.lat}) is off the elevation grid or over nodata, so altitudes above takeoff cannot be given; move it onto the grid.`);
  }
  return { frame, heights, area, targetHeightM: H, spacingM, baseM, footprint, stepM, takeoffXY, takeoffGroundM };
}

/** The flight lines: laid out by the caller, or uniformly at the mission's heading (or the advised one). */
function layLines(mission: Mission, g: PlanGround, opts: AnalyseOptions): { lines: FlightLine[]; headingDeg: number; headingAdvice: PlanResult['headingAdvice'] } {
  const headingAdvice = mission.headingDeg === 'advise' && !opts.lines
    ? adviseHeading(g.area, g.heights.sampleMany, { lineSpacingM: g.spacingM, triggerDistanceM: g.baseM, runInM: mission.runInM, sampleStepM: Math.max(g.stepM, 10) })
    : null;
  const headingDeg = headingAdvice ? headingAdvice.recommendedDeg : (mission.headingDeg as number);
  if (opts.lines) check(typeof mission.headingDeg === 'number' && opts.lines.length > 0, 'laid-out lines need the layout heading as a number and at least one line.');
  const lines = opts.lines ?? planFlightLines(g.area, { headingDeg, lineSpacingM: g.spacingM, triggerDistanceM: g.baseM, runInM: mission.runInM, takeoff: g.takeoffXY });
  return { lines, headingDeg, headingAdvice };
}

/** The mission's altitude limits around the height that gives the target GSD. */
function altitudeLimits(mission: Mission, targetHeightM: number): AltitudeLimits {
  return {
    targetHeightM,
    bandLowM: targetHeightM * (1 - mission.gsdTolerance),
    bandHighM: targetHeightM * (1 + mission.gsdTolerance),
    clearanceM: mission.clearanceM + mission.obstacleAllowanceM,
    maxAglM: mission.maxAglM,
    climbGradient: mission.climbMps / mission.speedMps,
    descentGradient: mission.descentMps / mission.speedMps,
    minLegLengthM: mission.minLegLengthM,
    maxLegsPerLine: mission.maxLegsPerLine,
    roundingM: mission.altitudeRoundingM,
  };
}

/** `minLegLengthM`: the shortest-leg setting the line was fitted with (a spot photo's hover has none). */
type LineProfile = { x: Float64Array; stationIdx: Int32Array; fit: ReturnType<typeof fitAltitudes>; minLegLengthM: number };

/**
 * Ground profiles (one batch sample per line, stations included as samples) and the altitudes fitted over them.
 * A line with no known ground at all has no safe altitude: it is left out of the flight and reported.
 */
function fitLines(laid: FlightLine[], g: PlanGround, mission: Mission, lim: AltitudeLimits, opts: AnalyseOptions): { lines: FlightLine[]; profiles: LineProfile[]; leftOut: FlightLine[] } {
  const laidProfiles = laid.map((line) => {
    const { x, stationIdx } = profileDistances(line, g.stepM);
    const xs = new Float64Array(x.length), ys = new Float64Array(x.length), z = new Float64Array(x.length);
    for (let i = 0; i < x.length; i++) { const p = pointAlong(line, x[i]); xs[i] = p[0]; ys[i] = p[1]; }
    g.heights.sampleMany(xs, ys, z);
    const own = opts.limitsFor ? opts.limitsFor(line, lim) : lim;
    return { x, stationIdx, fit: fitAltitudes(x, z, mission.mode, own, opts.bandGroundFor?.(line, x)), minLegLengthM: own.minLegLengthM };
  });
  const plannable = laidProfiles.map((p) => p.fit.unknownCount < p.x.length);
  const lines = laid.filter((_, i) => plannable[i]);
  if (lines.length === 0) {
    throw new TerrainError('all-nodata', 'The elevation grid has no data under any flight line of this area: no altitude can be planned. Move the area onto ground the grid covers, or upload a grid that covers it.');
  }
  return { lines, profiles: laidProfiles.filter((_, i) => plannable[i]), leftOut: laid.filter((_, i) => !plannable[i]) };
}

type LinePhotoStations = { headingDeg: number; row: number; x: Float64Array; y: Float64Array; altitudeM: Float64Array; mountTiltDeg?: number };

/**
 * The sets of lines by the direction they run: one set for parallel lines, two when a second set crosses the first
 * (the solver's lattice). Each set's layout heading is the layout's own turned by the set's angle to it; lines flown
 * either way along one direction are one set. Overlaps are between neighbouring lines of one set only.
 */
function lineSets(lines: ReadonlyArray<{ headingDeg: number }>, layoutHeadingDeg: number): Array<{ headingDeg: number; members: number[] }> {
  const sets: Array<{ key: number; headingDeg: number; members: number[] }> = [];
  lines.forEach((l, li) => {
    const key = Math.round(((((l.headingDeg - layoutHeadingDeg) % 180) + 180) % 180) * 1e6) / 1e6 % 180;
    let set = sets.find((t) => t.key === key);
    if (!set) { set = { key, headingDeg: layoutHeadingDeg + key, members: [] }; sets.push(set); }
    set.members.push(li);
  });
  return sets;
}

type LineSet = ReturnType<typeof lineSets>[number];

/** Each line's photo stations in the local frame at their fitted altitudes, with the line's row across the area (within its set). */
function stationPhotos(lines: FlightLine[], profiles: LineProfile[], sets: LineSet[]): LinePhotoStations[] {
  const rowOf = new Map<FlightLine, number>();
  for (const set of sets) {
    const offsets = [...new Set(set.members.map((li) => lines[li].offsetM))].sort((a, b) => a - b);
    for (const li of set.members) rowOf.set(lines[li], offsets.indexOf(lines[li].offsetM));
  }
  return lines.map((line, li) => {
    const { stationIdx, fit } = profiles[li];
    const n = line.stationsM.length;
    const px = new Float64Array(n), py = new Float64Array(n), alt = new Float64Array(n);
    for (let s = 0; s < n; s++) {
      const p = pointAlong(line, line.stationsM[s]);
      px[s] = p[0]; py[s] = p[1];
      alt[s] = fit.altitudeM[stationIdx[s]];
    }
    return { headingDeg: line.headingDeg, row: rowOf.get(line)!, x: px, y: py, altitudeM: alt, ...(line.mountTiltDeg ? { mountTiltDeg: line.mountTiltDeg } : {}) };
  });
}

/**
 * The mission's attitude envelope (none unless it names one): overlaps are then also given as guaranteed. An
 * envelope the lines cannot be held in (crosswind at least the airspeed) leaves the overlaps as planned only and
 * says why, as the coverage run refuses it: the plan's own figures still stand.
 */
function missionEnvelope(missionInput: unknown, mission: Mission, photos: LinePhotoStations[]): { envelope: AttitudeEnvelope | null; crabDegMax: number; refused: string | null } {
  try {
    const envelope = resolveCoverageInput(missionInput, mission).envelope;
    const crabDegMax = envelope ? Math.max(0, ...photos.map((p) => Math.abs(lineCrabDeg(p.headingDeg, envelope)))) : 0;
    return { envelope, crabDegMax, refused: null };
  } catch (err) {
    if (!(err instanceof TerrainError)) throw err;
    return { envelope: null, crabDegMax: 0, refused: err.message };
  }
}

/**
 * Station overlaps, GSD and flags over the real ground, and as guaranteed under the envelope when there is one;
 * without overlaps (`withOverlaps` false: AnalyseOptions.overlaps) only the heights, GSDs and their flags.
 */
function overlapsOf(mission: Mission, g: PlanGround, photos: LinePhotoStations[], sets: LineSet[], lim: AltitudeLimits, env: ReturnType<typeof missionEnvelope>, withOverlaps: boolean) {
  const cam = mission.camera;
  const band = gsdBandCm(mission);
  const { envelope, crabDegMax } = env;
  let marginPx = 0, attitudeCount = 0;
  const targets = {
    forwardOverlap: mission.forwardOverlap, sideOverlap: mission.sideOverlap, gsdMinCm: band.min, gsdMaxCm: band.max,
    maxAglM: mission.maxAglM, clearanceM: lim.clearanceM, plannedHeightM: g.targetHeightM,
  };
  const overlapsOfSet = (set: LinePhotoStations[], setHeadingDeg: number) => stationOverlaps(cam, g.heights.heightAt, set, setHeadingDeg, targets, envelope ? {
    extentsFor: (li, planned) => {
      const ge = guaranteedExtents(cam, g.heights.heightAt, set[li], setHeadingDeg, planned, envelope);
      marginPx = Math.max(marginPx, ge.marginPx);
      attitudeCount = Math.max(attitudeCount, ge.attitudeCount);
      return ge;
    },
    words: envelopeWords(envelope, crabDegMax),
  } : null);
  let results: StationResult[][];
  if (!withOverlaps) results = stationHeights(cam, g.heights.heightAt, photos, targets);
  else {
    // each set of lines against its own neighbours, along its own heading
    results = new Array<StationResult[]>(photos.length);
    for (const set of sets) {
      const r = overlapsOfSet(set.members.map((li) => photos[li]), set.headingDeg);
      set.members.forEach((li, k) => { results[li] = r[k]; });
    }
  }
  // read after stationOverlaps ran: the margins are gathered as the extents are computed
  return { results, band, lattice: () => ({ marginPx, attitudeCount }) };
}

/** The lines of the result in longitude/latitude, rounded, with their stations, legs, unmet stretches and warnings. */
function resultLines(mission: Mission, g: PlanGround, lines: FlightLine[], profiles: LineProfile[], photos: LinePhotoStations[], results: StationResult[][], homes: Float64Array): PlanLine[] {
  const cam = mission.camera;
  const gsdPerM = (pixelPitchMm(cam) / cam.focalLengthMm) * 100;
  const aboveTakeoff = (z: number) => round(z - g.takeoffGroundM, 2);
  const ll = (x: number, y: number) => { const [lon, lat] = g.frame.toLonLat(x, y); return { lon: round(lon, 8), lat: round(lat, 8) }; };
  return lines.map((line, li) => {
    const fit = profiles[li].fit;
    const stations: PlanStation[] = results[li].map((r, s) => ({
      ...ll(photos[li].x[s], photos[li].y[s]),
      distanceM: round(line.stationsM[s], 3),
      groundM: r.groundM === null ? null : round(r.groundM, 3),
      altitudeM: round(photos[li].altitudeM[s], 3),
      altitudeAboveTakeoffM: aboveTakeoff(photos[li].altitudeM[s]),
      aglM: r.aglM === null ? null : round(r.aglM, 3),
      gsdCm: r.gsdCm === null ? null : round(r.gsdCm, 4),
      forwardOverlap: r.forwardOverlap === null ? null : round(r.forwardOverlap, 4),
      sideOverlap: r.sideOverlap === null ? null : round(r.sideOverlap, 4),
      forwardOverlapGuaranteed: r.forwardOverlapGuaranteed === null ? null : round(r.forwardOverlapGuaranteed, 4),
      sideOverlapGuaranteed: r.sideOverlapGuaranteed === null ? null : round(r.sideOverlapGuaranteed, 4),
      flags: r.flags,
    }));
    const at = (d: number): PlanPoint => { const p = pointAlong(line, d); return { ...ll(p[0], p[1]), distanceM: round(d, 3) }; };
    const tiltCos2 = Math.cos(((line.mountTiltDeg ?? 0) * Math.PI) / 180) ** 2;
    const legs: PlanLeg[] = fit.legs.map((leg) => ({
      start: at(leg.startM),
      end: at(leg.endM),
      altitudeStartM: round(leg.altitudeStartM, 3),
      altitudeEndM: round(leg.altitudeEndM, 3),
      altitudeStartAboveTakeoffM: aboveTakeoff(leg.altitudeStartM),
      altitudeEndAboveTakeoffM: aboveTakeoff(leg.altitudeEndM),
      aglMinM: round(leg.aglMinM, 3),
      aglMaxM: round(leg.aglMaxM, 3),
      // a tilted camera's GSD at the image centre on level ground: h·p / (f·cos² t) (stationGsdCm in overlap.ts)
      gsdMinCm: round((leg.aglMinM * gsdPerM) / tiltCos2, 4),
      gsdMaxCm: round((leg.aglMaxM * gsdPerM) / tiltCos2, 4),
      gradient: round(leg.gradient, 6),
    }));
    // against the setting the line was fitted with: a spot photo's 1 m hover is that short by design
    const warnings: PlanWarning[] = shortLegWarnings(li, line.lengthM, legs, profiles[li].minLegLengthM);
    if (fit.unknownCount > 0) {
      warnings.push({ code: 'ground-unknown', message: `Line ${li + 1}: ${fit.unknownCount} of ${fit.groundM.length} ground samples ${fit.unknownCount === 1 ? 'has' : 'have'} no elevation data; ${fit.unknownCount === 1 ? 'its height was' : 'heights there were'} carried over from known neighbours.` });
    }
    // where a battery change after this line flies home from
    const home = Number.isFinite(homes[li]) ? { returnAltitudeAboveTakeoffM: round(homes[li] - g.takeoffGroundM, 3) } : {};
    return {
      index: li, headingDeg: round(line.headingDeg, 6), lengthM: round(line.lengthM, 3),
      start: ll(line.start[0], line.start[1]), end: ll(line.end[0], line.end[1]),
      areaStartM: round(line.areaStartM, 3), areaEndM: round(line.areaEndM, 3),
      ...(line.mountTiltDeg ? { cameraTiltDeg: round(line.mountTiltDeg, 3) } : {}),
      ...home,
      stations, legs, unmet: fit.unmet.map((u) => ({ ...u, startM: round(u.startM, 3), endM: round(u.endM, 3) })), warnings,
    };
  });
}

/** Station figures over the whole plan: GSD spread, least overlaps, heights above ground, flagged stations, reach. */
function stationFigures(results: StationResult[][], photos: LinePhotoStations[], band: { min: number; max: number }, takeoffXY: [number, number]) {
  const gsds: number[] = [], agls: number[] = [];
  let fwdMin = Infinity, sideMin = Infinity, fwdGMin = Infinity, sideGMin = Infinity, within = 0, flagged = 0, photoCount = 0, maxFromTakeoff = 0;
  results.forEach((lr, li) => lr.forEach((r, s) => {
    photoCount++;
    if (r.gsdCm !== null) { gsds.push(r.gsdCm); if (r.gsdCm >= band.min - 1e-9 && r.gsdCm <= band.max + 1e-9) within++; }
    if (r.aglM !== null) agls.push(r.aglM);
    if (r.forwardOverlap !== null) fwdMin = Math.min(fwdMin, r.forwardOverlap);
    if (r.sideOverlap !== null) sideMin = Math.min(sideMin, r.sideOverlap);
    if (r.forwardOverlapGuaranteed !== null) fwdGMin = Math.min(fwdGMin, r.forwardOverlapGuaranteed);
    if (r.sideOverlapGuaranteed !== null) sideGMin = Math.min(sideGMin, r.sideOverlapGuaranteed);
    if (r.flags.length > 0) flagged++;
    maxFromTakeoff = Math.max(maxFromTakeoff, Math.hypot(photos[li].x[s] - takeoffXY[0], photos[li].y[s] - takeoffXY[1]));
  }));
  gsds.sort((a, b) => a - b);
  return { gsds, agls, fwdMin, sideMin, fwdGMin, sideGMin, within, flagged, photoCount, maxFromTakeoff };
}

/** Flight distance (lines, transits between them, to the first and from the last) and the time and batteries it takes. */
function flightEstimate(mission: Mission, lines: FlightLine[], profiles: LineProfile[], g: PlanGround, photoCount: number) {
  let lineDistanceM = 0, transitDistanceM = 0;
  lines.forEach((l, i) => {
    lineDistanceM += l.lengthM;
    if (i > 0) transitDistanceM += Math.hypot(l.start[0] - lines[i - 1].end[0], l.start[1] - lines[i - 1].end[1]);
  });
  const first = lines[0], last = lines[lines.length - 1];
  transitDistanceM += Math.hypot(first.start[0] - g.takeoffXY[0], first.start[1] - g.takeoffXY[1]) + Math.hypot(last.end[0] - g.takeoffXY[0], last.end[1] - g.takeoffXY[1]);
  const startAlt = (i: number) => profiles[i].fit.legs[0]?.altitudeStartM ?? NaN;
  const endAlt = (i: number) => { const legs = profiles[i].fit.legs; return legs[legs.length - 1]?.altitudeEndM ?? NaN; };
  const firstAlt = startAlt(0), lastAlt = endAlt(profiles.length - 1);
  // a transit is flown at the higher of its two ends (climb before, descend after: see transitWarnings), so the
  // change of altitude between lines is flown vertically, at the vertical speeds, on top of the level distance
  let climbM = Number.isFinite(firstAlt) ? Math.max(0, firstAlt - g.takeoffGroundM) : 0;
  let descentM = Number.isFinite(lastAlt) ? Math.max(0, lastAlt - g.takeoffGroundM) : 0;
  for (let i = 1; i < profiles.length; i++) {
    const dz = startAlt(i) - endAlt(i - 1);
    if (dz > 0) climbM += dz;
    else if (dz < 0) descentM -= dz;
  }
  return estimateMission({
    photoCount, lineDistanceM, transitDistanceM, lineCount: lines.length, speedMps: mission.speedMps, turnTimeS: mission.turnTimeS,
    climbM, descentM,
    climbMps: mission.climbMps, descentMps: mission.descentMps, enduranceMin: mission.enduranceMin, batteryReserve: mission.batteryReserve,
  });
}

/** Analyse a mission over an elevation grid (grid heights in metres above its vertical datum). */
export function analysePlan(grid: Grid, missionInput: unknown, opts: AnalyseOptions = {}): PlanResult {
  // the input is resolved once; every stage below takes the resolved mission (the envelope also reads the input's own fields)
  const mission = opts.mission ?? resolveMission(missionInput);
  const g = planGround(grid, mission);
  const { lines: laid, headingDeg, headingAdvice } = layLines(mission, g, opts);
  const lim = altitudeLimits(mission, g.targetHeightM);
  const { lines, profiles, leftOut } = fitLines(laid, g, mission, lim, opts);
  const sets = lineSets(lines, headingDeg);
  const photos = stationPhotos(lines, profiles, sets);
  const env = missionEnvelope(missionInput, mission, photos);
  const { envelope, crabDegMax } = env;
  const { results, band, lattice } = overlapsOf(mission, g, photos, sets, lim, env, opts.overlaps !== false);
  const homes = returnAltitudes(lines, profiles, g, lim.clearanceM);
  const outLines = resultLines(mission, g, lines, profiles, photos, results, homes);
  const f = stationFigures(results, photos, band, g.takeoffXY);
  const { gsds, agls, photoCount, flagged } = f;
  const med = gsds.length === 0 ? null : gsds.length % 2 ? gsds[gsds.length >> 1] : (gsds[gsds.length / 2 - 1] + gsds[gsds.length / 2]) / 2;
  const est = flightEstimate(mission, lines, profiles, g, photoCount);
  // the flown profile between photos counts too: a dip between two stations can take the aircraft over the
  // height limit, and the range shown must agree with the unmet stretch that says so
  for (const l of outLines) for (const leg of l.legs) if (Number.isFinite(leg.aglMinM) && Number.isFinite(leg.aglMaxM)) agls.push(leg.aglMinM, leg.aglMaxM);
  const unmetLengthM = outLines.reduce((s, l) => s + l.unmet.reduce((t, u) => t + (u.endM - u.startM), 0), 0);
  const { marginPx, attitudeCount } = lattice();
  const summary: PlanSummary = {
    lineCount: lines.length,
    photoCount,
    flightDistanceM: round(est.flightDistanceM, 1),
    flightTimeS: round(est.flightTimeS, 1),
    batteries: est.batteries,
    gsdCm: { min: gsds.length ? round(gsds[0], 4) : null, median: med === null ? null : round(med, 4), max: gsds.length ? round(gsds[gsds.length - 1], 4) : null },
    forwardOverlapMin: orNull(round(f.fwdMin, 4)),
    sideOverlapMin: orNull(round(f.sideMin, 4)),
    forwardOverlapGuaranteedMin: orNull(round(f.fwdGMin, 4)),
    sideOverlapGuaranteedMin: orNull(round(f.sideGMin, 4)),
    overlapEnvelope: envelope ? {
      rollDeg: envelope.rollDeg, pitchDeg: envelope.pitchDeg, windMps: envelope.windMps, windFromDeg: envelope.windFromDeg,
      airspeedMps: envelope.airspeedMps, crabs: envelope.crabs, crabDegMax: round(crabDegMax, 2), stepDeg: envelope.stepDeg,
      marginPx: round(marginPx, 2), attitudeCount, words: envelopeWords(envelope, crabDegMax),
    } : null,
    aglMinM: agls.length ? round(Math.min(...agls), 3) : null,
    aglMaxM: agls.length ? round(Math.max(...agls), 3) : null,
    shareWithinGsdTarget: photoCount ? round(f.within / photoCount, 4) : 0,
    flaggedStationCount: flagged,
    unmetLengthM: round(unmetLengthM, 1),
    mode: mission.mode,
    headingDeg,
    plannedHeightM: round(g.targetHeightM, 3),
    gsdBandCm: { min: round(band.min, 4), max: round(band.max, 4) },
    lineSpacingM: round(g.spacingM, 3),
    triggerDistanceM: round(g.baseM, 3),
    footprintAcrossM: round(g.footprint.acrossM, 3),
    footprintAlongM: round(g.footprint.alongM, 3),
    maxDistanceFromTakeoffM: round(f.maxFromTakeoff, 1),
  };
  const warnings = planWideWarnings(mission, g, lim, lines, profiles, outLines, { leftOut, unmetLengthM, flagged, photoCount, envelope, envelopeRefused: env.refused, est, maxFromTakeoffM: f.maxFromTakeoff });
  return {
    lines: outLines,
    summary,
    warnings,
    takeoff: { lon: mission.takeoff.lon, lat: mission.takeoff.lat, groundM: round(g.takeoffGroundM, 3), geoidUndulationM: round(geoidUndulationM(mission.takeoff.lat, mission.takeoff.lon), 3), ...finalReturn(homes, g) },
    heights: {
      datum: `altitudeM, groundM: metres above the elevation grid's vertical datum (${opts.verticalDatum ? opts.verticalDatum.name : 'not stated in the file; usually orthometric, e.g. EGM96 or a national datum'})`,
      aboveTakeoff: 'altitude…AboveTakeoffM: metres above the ground at the takeoff point, as sampled from the grid',
      verticalDatum: opts.verticalDatum ?? null,
    },
    headingAdvice,
    frame: { crs: g.frame.crs.name, epsg: g.frame.crs.epsg },
  };
}

/**
 * Per line, the altitude (above the datum) the straight way home from its end keeps the clearance at (the transit
 * check's own sampling, every metre: `transitShortfallM`), never below the end's altitude, rounded up to the
 * decimetre where raised; NaN for a line without legs. The last line's is the mission's own return.
 */
function returnAltitudes(lines: FlightLine[], profiles: LineProfile[], g: PlanGround, clearanceM: number): Float64Array {
  return Float64Array.from(lines, (line, li) => {
    const legs = profiles[li].fit.legs;
    const endM = legs[legs.length - 1]?.altitudeEndM;
    if (!Number.isFinite(endM)) return NaN;
    const short = transitShortfallM(line.end, g.takeoffXY, endM, g.heights.heightAt, clearanceM, 1);
    return short > 0 ? Math.ceil((endM + short) * 10) / 10 : endM;
  });
}

/** The mission's return (the last line's way home) for the result's takeoff: above the datum and above takeoff; empty without one. */
function finalReturn(homes: Float64Array, g: PlanGround): { returnAltitudeM?: number; returnAltitudeAboveTakeoffM?: number } {
  const altM = homes[homes.length - 1];
  return Number.isFinite(altM) ? { returnAltitudeM: round(altM, 3), returnAltitudeAboveTakeoffM: round(altM - g.takeoffGroundM, 3) } : {};
}

/** The plan-wide warnings: safety, transits, each line's own, then what the plan as a whole leaves undone. */
function planWideWarnings(
  mission: Mission, g: PlanGround, lim: AltitudeLimits, lines: FlightLine[], profiles: LineProfile[], outLines: PlanLine[],
  s: { leftOut: FlightLine[]; unmetLengthM: number; flagged: number; photoCount: number; envelope: AttitudeEnvelope | null; envelopeRefused: string | null; est: ReturnType<typeof estimateMission>; maxFromTakeoffM: number },
): PlanWarning[] {
  const warnings: PlanWarning[] = [
    ...planSafetyWarnings(mission, { maxDistanceFromTakeoffM: s.maxFromTakeoffM, targetHeightM: g.targetHeightM }),
    ...transitWarnings(lines, profiles.map((p) => p.fit.legs), g.takeoffXY, g.takeoffGroundM, g.heights.heightAt, lim.clearanceM),
    ...outLines.flatMap((l) => l.warnings),
  ];
  if (s.envelopeRefused) warnings.push({ code: 'envelope-refused', message: `Overlaps are given as planned only: the attitude envelope cannot be applied (${s.envelopeRefused})` });
  if (s.leftOut.length > 0) {
    const m = s.leftOut.reduce((t, l) => t + l.lengthM, 0);
    warnings.push({ code: 'lines-left-out', message: `${s.leftOut.length} flight line${s.leftOut.length > 1 ? 's' : ''} (${Math.round(m)} m) lie entirely over ground the grid has no data for and were left out: that strip of the area is not covered. Extend the grid or shrink the area.` });
  }
  if (s.unmetLengthM > 0) {
    const byReason = new Map<string, number>();
    for (const l of outLines) for (const u of l.unmet) byReason.set(u.reason, (byReason.get(u.reason) ?? 0) + u.endM - u.startM);
    warnings.push({ code: 'band-not-held', message: `The GSD band or the height limit is not held over ${lineLengthWords(s.unmetLengthM)} of line: ${unmetByReasonWords(byReason)}. See each line's unmet stretches.` });
  }
  if (s.flagged > 0) warnings.push({ code: 'stations-flagged', message: `${s.flagged} of ${s.photoCount} photos are flagged (overlap or GSD off target over the real terrain${s.envelope ? ', or overlap under the attitude envelope' : ''}); see each station's flags.` });
  if (s.est.batteries > 1) warnings.push({ code: 'batteries', message: `The flight needs at least ${s.est.batteries} batteries (${round(s.est.flightTimeS / 60, 1)} min of flight, ${round(s.est.usablePerBatteryS / 60, 1)} min usable per battery after the reserve); each change adds a flight home and back out, so the leg sheet's battery plan, which packs the lines, may need more.` });
  return warnings;
}
