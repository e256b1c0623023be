/** Spec in, plan out: the plan that meets the coverage spec on every reachable cell in the least flight time found, every choice explained, proved by its own coverage raster. */
import type { Grid } from './grid';
import { cellX, cellY } from './coverage-grid';
import { resolveMission, type Mission } from './mission';
import { resolveCoverageInput } from './coverage-spec';
import { localHeights } from './local-frame';
import { planFlightLines, polygonToLocal, type FlightLine } from './lines';
import { adviseHeading, compareHeadingOptions } from './heading';
import { analysePlan, autoStepM, type AnalyseOptions } from './plan';
import type { AltitudeLimits } from './altitude';
import type { PlanResult } from './plan-result';
import { resolveSolveOptions, type SolvePattern } from './solve-options';
import { forwardOverlapForSlant, forwardOverlapForViews, viewGeometry } from './solve-geometry';
import { stripLowM, type LineContext, type Strip } from './solve-line';
import { fitOrCut, type LineCut } from './solve-cut';
import { layoutRows, rotated, type LayoutRow } from './solve-layout';
import { placeTriggers } from './solve-triggers';
import { flightTimeWithLegSpeedsS, legSpeedMps } from './solve-speed';
import { makeVerifier, type Verdict, type Verifier } from './solve-verify';
import { bestUniform, type UniformOutcome, type UniformSetting } from './solve-uniform';
import { areaBeyond } from './area-beyond';
import { transitShortfallM } from './plan-warnings';
import { placeSpots, spotLimits, spotLine, tourGap, tourOrder, type Spot } from './solve-spots';

const round = (v: number, d: number) => { const f = 10 ** d; return Math.round(v * f) / f; };

/** Why one line is where it is and flies as it does. */
interface LineChoice {
  line: number;
  /** A line of the layout, or a spot photo's short line (flown in a tour between two layout lines). */
  kind: 'line' | 'spot';
  /** Which set of lines: 1, or 2 for the lattice's second set across the first (a spot counts with set 1). */
  set: number;
  offsetM: number;
  spacingToNextM: number | null;
  speedMps: { min: number; max: number };
  triggerDistanceM: { min: number; max: number };
  legs: number;
  reasons: string[];
}

/** A group of cells no plan of the pattern can meet within the limits. */
interface UnreachableGroup {
  reason: 'ground-unknown' | 'slope-gsd';
  message: string;
  cells: number;
  areaM2: number;
  centroid: { lon: number; lat: number };
}

/** Reachable cells the solved plan still leaves short, by spec item. */
interface ShortGroup {
  item: 'gsd' | 'views' | 'directions' | 'other';
  cells: number;
  areaM2: number;
  slopeDeg: { min: number; max: number };
  centroid: { lon: number; lat: number };
  message: string;
}

/** What the solver adds to the plan document. */
interface SolveReport {
  pattern: SolvePattern;
  choices: {
    headingDeg: number; heading: string; pattern: string; lines: LineChoice[]; fallback: string | null; summary: string;
    /** Which tightening round's lines were kept and why: each round's lines and spot photos, timed. */
    tightening: string;
  };
  unreachable: UnreachableGroup[];
  proof: {
    cellM: number; cellsInArea: number; reachableCells: number; shareReachableMeeting: number; meets: boolean;
    items: Array<{ item: string; asks: string; share: number }>;
    /** Reachable cells still short after the repair rounds (0 when the plan meets the spec). */
    shortCells: number;
    /** Those cells by spec item, with the slopes they lie on and why the solver could not close them. */
    short: ShortGroup[];
    basis: string;
  };
  comparison: { uniform: Array<{ setting: UniformSetting; flightTimeS: number; photoCount: number; batteries: number; shareReachable: number | null; meets: boolean | null }>; bestUniformFlightTimeS: number | null; solvedFlightTimeS: number; ratio: number | null };
  rounds: number;
}

export type SolvedPlan = PlanResult & SolveReport;

/** Options of one solve. */
interface SolveOptionsArg extends AnalyseOptions {
  /** Uniform settings to compare with besides the mission's own (the bench passes the sweep's best). */
  uniform?: UniformSetting[];
  /**
   * Analyse every candidate layout and yardstick plan with its overlaps, and every yardstick's whole raster
   * (default false: only the returned plan carries overlaps, and a yardstick's raster stops at its first short
   * cell, its share then null; no choice reads either). The same plan comes back either way; tests compare the two.
   */
  candidatesInFull?: boolean;
}

interface Built {
  /** Per set of lines (one, or two for a lattice), its rows across the area at its own heading. */
  plan: PlanResult; rows: LayoutRow[][]; choices: LineChoice[]; flightTimeS: number;
  /** Transits to, from or between spot photos that come inside the clearance flown straight (the plan warns of each). */
  unsafeSpotHops: number;
  /** The same layout analysed with every figure (overlaps as planned and guaranteed). */
  full: () => Built;
}

/** A piece of a laid line cut at faces (`solve-cut.ts`): which piece of how many, and the cuts either side of it. */
interface PieceOf { piece: number; pieces: number; before: LineCut | null; after: LineCut | null }

/** Repairs found by checking the raster, per set of lines: places (cross-track) that need a lower line or more photos along. */
interface Repairs { lower: number[]; views: number[] }

/** A layout checked by its raster: the repairs it was built with and the round that made them. */
interface Candidate {
  built: Built; verdict: Verdict; rep: Repairs[]; round: number;
  /** Spot photos added to the round's lines (0 before closing). */
  spots?: number;
}

export function solvePlan(grid: Grid, input: unknown, opts: SolveOptionsArg = {}): SolvedPlan {
  const mission = resolveMission(input);
  const { spec, envelope, settings } = resolveCoverageInput(input, mission);
  const so = resolveSolveOptions(input, mission);
  const geometry = viewGeometry(mission.camera, spec, envelope);
  const verifier = makeVerifier(grid, mission, spec, envelope, settings, geometry.gsdPerM);
  const frame = verifier.frame;
  const heights = localHeights(grid, frame);
  const area = polygonToLocal(mission.area as never, frame.toLocal);
  // where lines are laid: the area, or the area grown by solve.beyondEdgeM (the proof stays over the area's own cells)
  const layArea = so.beyondEdgeM > 0 ? polygonToLocal(areaBeyond(mission.area, so.beyondEdgeM) as never, frame.toLocal) : area;
  const ring = mission.area.coordinates[0];
  const lat = ring.slice(0, -1).reduce((t, p) => t + p[1], 0) / (ring.length - 1);
  const stepM = mission.stationStepM ?? autoStepM(grid, lat);
  const takeoffXY = frame.toLocal(mission.takeoff.lon, mission.takeoff.lat);
  const datum = opts.verticalDatum ? opts.verticalDatum.name : "the grid's vertical datum";
  const inputObj = input as Record<string, unknown>;
  // the pattern: asked for, or a lattice when the spec asks for views from all round and nadir photos can see its
  // slant from the lines either side (spacing at least 2h·tan θ so a point between lines is seen slanting from both,
  // at most 0.9·h·tan(half-angle across) so a point under a line is in its neighbours' photos), else the lattice
  // with the camera tilted (slant)
  const nadirSeesSlant = 2 * Math.tan((spec.obliqueDeg * Math.PI) / 180) <= 0.9 * geometry.tanAcross && forwardOverlapForSlant(geometry, spec.obliqueDeg) !== null;
  const pattern: SolvePattern = so.pattern ?? (spec.maxDirectionGapDeg === null ? 'furrow' : nadirSeesSlant ? 'lattice' : 'slant');
  // a second set of lines across the first
  const lattice = pattern !== 'furrow';
  // slant: the camera tilted towards the nose on every line; lines fly lower by cos² t, so the GSD at the image
  // centre on level ground, h·p / (f·cos² t), is the one a nadir photo has at the height the spec allows
  const tiltDeg = pattern === 'slant' ? (so.tiltDeg ?? Math.min(60, spec.obliqueDeg + 5)) : 0;
  const tiltFactor = Math.cos((tiltDeg * Math.PI) / 180) ** 2;
  const setCount = lattice ? 2 : 1;
  // a line may be cut at a face where the aircraft can stop and climb straight up: not a fixed wing (it crabs)
  const cutAtFaces = so.cutAtFaces ?? !(envelope?.crabs ?? false);
  /** The heading of set 0 (the layout's) or set 1 (a quarter turn on, across it). */
  const setHeadingOf = (headingDeg: number, set: number) => (headingDeg + 90 * set) % 360;
  // every point is seen from both sets of a lattice: each set carries half the views the spec asks for
  const viewsPerSet = lattice ? Math.ceil(Math.max(1, spec.minViews) / 2) : Math.max(1, spec.minViews);
  // the side overlap floor: a furrow's strips need only join (10 %) under the envelope's roll; a lattice's point
  // straight under a line must also be seen, slanting, by the lines either side, so neighbours are at most 0.9 of
  // a half strip apart (55 %): with the spacing of a furrow, 13 % of the demo's cells were seen from too few sides
  // at 15° from the vertical, with 55 % under 2 % (our measurement; tests/terrain/solve-lattice.test.ts)
  const sideFloor = so.minSideOverlap ?? (lattice ? 0.55 : 0.1);
  // along a lattice's lines the same: each point seen from ahead and behind at the spec's slant (null: the spec asks
  // for none, or the camera's half-angle along the track is too narrow for it and the raster shows what is left)
  const slantForward = pattern === 'lattice' && spec.maxDirectionGapDeg !== null ? forwardOverlapForSlant(geometry, spec.obliqueDeg) : null;
  const baseHalf = geometry.specHeightM * geometry.tanAcross;
  const nominalS = 2 * baseHalf * (1 - sideFloor);
  // heading candidates: the advice's best headings under the solver's nominal spacing
  let headings: number[];
  let headingWhy: string;
  if (typeof mission.headingDeg === 'number') {
    headings = [mission.headingDeg];
    headingWhy = `the mission sets the heading to ${mission.headingDeg}°`;
  } else {
    const advice = adviseHeading(area, heights.sampleMany, { lineSpacingM: nominalS, triggerDistanceM: baseHalf, runInM: mission.runInM, sampleStepM: Math.max(stepM, 10) });
    const ranked = [...advice.options].sort(compareHeadingOptions);
    headings = [];
    for (const o of ranked) {
      if (headings.every((h) => Math.min(Math.abs(h - o.headingDeg), 180 - Math.abs(h - o.headingDeg)) >= 10)) headings.push(o.headingDeg);
      if (headings.length >= so.headingCandidates) break;
    }
    headingWhy = `candidates ${headings.map((h) => `${h}°`).join(', ')} (the least spread of height above ground in the heading advice)`;
  }
  type LineInfo = { line: FlightLine; set: number; row: number; fitSpeed: number; slowedForM: number; factor: number; trig: ReturnType<typeof placeTriggers>; fwd: number; views: number; plannable: boolean; spot?: Spot; cut?: PieceOf;
    /** Fitted altitude at the line's start and end (metres above the grid's datum; NaN for a spot). */
    endsM: [number, number] };
  interface Layout { lines: FlightLine[]; info: LineInfo[]; rowsBySet: LayoutRow[][]; limitsBy: Map<FlightLine, AltitudeLimits>; stripBy: Map<FlightLine, Strip>; ctxBy: Map<FlightLine, LineContext> }
  // the lines of one heading and set of repairs, fitted once: spot rounds add spots to the same lines
  const layouts = new Map<string, Layout>();
  const layOut = (headingDeg: number, reps: Repairs[]): Layout => {
    const key = JSON.stringify([headingDeg, reps]);
    const known = layouts.get(key);
    if (known) return known;
    const near = (list: number[], c: number) => list.filter((v) => Math.abs(v - c) <= nominalS / 2).length;
    const lines: FlightLine[] = [];
    const rowsBySet: LayoutRow[][] = [];
    const limitsBy = new Map<FlightLine, AltitudeLimits>();
    const stripBy = new Map<FlightLine, Strip>();
    const ctxBy = new Map<FlightLine, LineContext>();
    const info: LineInfo[] = [];
    // the second set starts where the first ends
    let startNear: [number, number] = takeoffXY;
    for (let set = 0; set < setCount; set++) {
      const setHeading = setHeadingOf(headingDeg, set);
      const rep = reps[set] ?? { lower: [], views: [] };
      const ctx: LineContext = { area: layArea, headingDeg: setHeading, mission, heights, stepM, geometry, minSpeedMps: so.minSpeedMps };
      const factorAt = (c: number) => tiltFactor * 0.97 * 0.92 ** near(rep.lower, c);
      const viewsAt = (c: number) => viewsPerSet + near(rep.views, c);
      const rows = layoutRows(ctx, factorAt, sideFloor);
      rowsBySet.push(rows);
      const offsets = rows.map((r) => r.offsetM);
      const laid = planFlightLines(layArea, { headingDeg: setHeading, lineSpacingM: nominalS, triggerDistanceM: Math.max(5, baseHalf), runInM: mission.runInM, offsetsM: offsets, takeoff: startNear });
      for (const l of laid) {
        const row = offsets.findIndex((c) => Math.abs(c - l.offsetM) < 1e-6);
        const factor = factorAt(l.offsetM);
        // strip sides in the flying direction: a line flown against the layout heading has its neighbours swapped
        const lower = row > 0 ? (offsets[row] - offsets[row - 1]) / 2 : baseHalf;
        const upper = row + 1 < offsets.length ? (offsets[row + 1] - offsets[row]) / 2 : baseHalf;
        const d = (((l.headingDeg - setHeading) % 360) + 360) % 360;
        const along = d < 90 || d > 270;
        const belowM = along ? lower : upper, aboveM = along ? upper : lower;
        // whole, or cut at faces where flying two pieces with a stop beats slowing the whole line
        const { pieces, cuts } = fitOrCut(ctx, l, factor, { belowM, aboveM }, cutAtFaces);
        const views = viewsAt(l.offsetM);
        const fwd = Math.max(forwardOverlapForViews(views, so.minForwardOverlap), slantForward ?? 0);
        pieces.forEach((fitted, k) => {
          const trig = placeTriggers(fitted.line, fitted.x, fitted.fit.altitudeM, heights, { belowM, aboveM }, geometry.tanAlong, fwd, 2 * geometry.specHeightM * factor * geometry.tanAlong);
          const line: FlightLine = { ...fitted.line, index: lines.length, stationsM: trig.stationsM, ...(tiltDeg ? { mountTiltDeg: tiltDeg } : {}) };
          limitsBy.set(line, fitted.limits);
          stripBy.set(line, { belowM, aboveM });
          ctxBy.set(line, ctx);
          const cut = pieces.length > 1 ? { piece: k + 1, pieces: pieces.length, before: k > 0 ? cuts[k - 1] : null, after: k + 1 < pieces.length ? cuts[k] : null } : undefined;
          info.push({ line, set, row, fitSpeed: fitted.fitSpeedMps, slowedForM: fitted.slowedForM, factor, trig, fwd, views, plannable: fitted.fit.unknownCount < fitted.x.length, cut, endsM: [fitted.fit.altitudeM[0], fitted.fit.altitudeM[fitted.fit.altitudeM.length - 1]] });
          lines.push(line);
        });
      }
      if (lines.length > 0) startNear = lines[lines.length - 1].end;
    }
    const result: Layout = { lines, info, rowsBySet, limitsBy, stripBy, ctxBy };
    layouts.set(key, result);
    return result;
  };
  const build = (headingDeg: number, reps: Repairs[], spots: Spot[] = []): Built => {
    const laid = layOut(headingDeg, reps);
    const { rowsBySet, limitsBy, stripBy, ctxBy } = laid;
    const lines = [...laid.lines], info = [...laid.info];
    const ctx: LineContext = { area: layArea, headingDeg, mission, heights, stepM, geometry, minSpeedMps: so.minSpeedMps };
    // spot photos as one tour between two lines of the layout (both ends high: the transits to and from the tour
    // are flown at the lines' altitude), in the gap where its transits keep the clearance at the least detour
    if (spots.length > 0 && lines.length > 0) {
      const rot = rotated(headingDeg);
      // a transit flies at the higher of its two ends: the lines' fitted altitudes there (the band's low end, 0.6 of
      // its top, where a line has none)
      const at = (p: [number, number], altM = NaN): [number, number, number] => [p[0], p[1], Number.isFinite(altM) ? altM : heights.heightAt(p[0], p[1]) + 0.6 * geometry.specHeightM * 0.97];
      // never between two parts of a line cut at a face: the aircraft stops there only to climb or descend
      const gaps = lines.slice(0, -1).map((l, k) => ({ k, from: at(l.end, info[k].endsM[1]), to: at(lines[k + 1].start, info[k + 1].endsM[0]) })).filter((q) => !info[q.k].cut?.after);
      const takeoffAt: [number, number, number] = [takeoffXY[0], takeoffXY[1], heights.heightAt(takeoffXY[0], takeoffXY[1])];
      if (gaps.length === 0) gaps.push({ k: lines.length - 1, from: at(lines[lines.length - 1].end, info[lines.length - 1].endsM[1]), to: takeoffAt });
      const tour = tourOrder(spots, gaps[gaps.length - 1].from, gaps[gaps.length - 1].to, mission, heights.heightAt);
      const chosen = tourGap(tour, gaps, mission, heights.heightAt);
      const gap = gaps[chosen.gap].k, reversed = chosen.reversed;
      const ordered = reversed ? [...tour].reverse() : tour;
      const spotLines = ordered.map((sp) => {
        const line = spotLine(sp, rot.c(sp.x, sp.y));
        limitsBy.set(line, spotLimits(sp, mission));
        return { line, info: { line, set: 0, row: -1, fitSpeed: mission.speedMps, slowedForM: 0, factor: sp.heightM / geometry.specHeightM, trig: { stationsM: line.stationsM, minM: 0, maxM: 0, tightestGroundM: sp.groundM, tightestAtM: 0 }, fwd: 0, views: 1, plannable: Number.isFinite(sp.groundM), spot: sp, endsM: [NaN, NaN] as [number, number] } };
      });
      const all = [...info.slice(0, gap + 1), ...spotLines.map((q) => q.info), ...info.slice(gap + 1)];
      lines.length = 0;
      info.length = 0;
      // renumbered in flying order; the maps are keyed by the line objects
      all.forEach((it, k) => {
        const line = { ...it.line, index: k };
        const lim = limitsBy.get(it.line), strip = stripBy.get(it.line), lc = ctxBy.get(it.line);
        if (lim) limitsBy.set(line, lim);
        if (strip) stripBy.set(line, strip);
        if (lc) ctxBy.set(line, lc);
        lines.push(line);
        info.push({ ...it, line });
      });
    }
    // the analysed mission's GSD band is the spec's (finer is never a fault), so station flags speak of the spec
    const finish = (overlaps: boolean): Built => {
      const plan = analysePlan(grid, { ...inputObj, headingDeg, mode: 'follow', targetGsdCm: spec.maxGsdCm / 1.5, gsdTolerance: 0.5, forwardOverlap: Math.min(0.95, forwardOverlapForViews(spec.minViews, so.minForwardOverlap)), sideOverlap: sideFloor }, {
        verticalDatum: opts.verticalDatum, lines, limitsFor: (line, lim) => limitsBy.get(line) ?? lim,
        bandGroundFor: (line, x) => { const s = stripBy.get(line); const lim = limitsBy.get(line); return s && lim ? stripLowM(ctxBy.get(line) ?? ctx, line, x, s, lim.bandHighM) : undefined; },
        overlaps,
      });
      const kept = info.filter((i) => i.plannable);
      const choices: LineChoice[] = plan.lines.map((pl, li) => {
        const it = kept[li];
        let vMin = Infinity, vMax = 0;
        for (const g of pl.legs) {
          const v = round(legSpeedMps(mission, g.gradient), 2);
          g.speedMps = v;
          vMin = Math.min(vMin, v); vMax = Math.max(vMax, v);
          const st = pl.stations.filter((s) => s.distanceM >= g.start.distanceM - 1e-6 && s.distanceM <= g.end.distanceM + 1e-6).map((s) => s.distanceM);
          const d = st.slice(1).map((v2, k) => v2 - st[k]);
          if (d.length) g.triggerDistanceM = { min: round(Math.min(...d), 2), max: round(Math.max(...d), 2) };
        }
        const row = it && !it.spot ? rowsBySet[it.set][it.row] : undefined;
        const reasons: string[] = [];
        const sp = it?.spot;
        if (sp) {
          const [lon, lat2] = frame.toLonLat(sp.x, sp.y);
          const gsdAt = (sp.heightM * geometry.gsdPerM) / Math.cos((sp.slopeDeg * Math.PI) / 180);
          reasons.push(`spot photo straight above ground sloping ${round(sp.slopeDeg, 0)}° at ${round(sp.groundM, 1)} m above ${datum} (lon ${round(lon, 6)}, lat ${round(lat2, 6)}): the layout's photos see ${sp.cells} cell${sp.cells === 1 ? '' : 's'} here no finer than the spec's ${spec.maxGsdCm} cm. ${round(sp.heightM, 1)} m above the ground gives about ${round(gsdAt, 2)} cm along the slope (height × pixel pitch / focal length / cos slope), never below the ${mission.clearanceM + mission.obstacleAllowanceM} m clearance and allowance; the aircraft stops, takes one photo and moves on.`);
        } else if (it && row) {
          const nx = row.next;
          const rowNo = (r: number) => { const k = kept.findIndex((q) => !q.spot && q.set === it.set && q.row === r); return k >= 0 ? k + 1 : null; };
          if (setCount > 1) reasons.push(it.set === 0 ? `first set of the ${pattern}, flown at ${headingDeg}°.` : `second set of the ${pattern}, across the first at ${setHeadingOf(headingDeg, 1)}°: every point is seen from four sides, not two.`);
          if (tiltDeg) reasons.push(`camera tilted ${tiltDeg}° from straight down towards the nose (set on the gimbal before the line): the photos look ${round(it.line.headingDeg, 0)}° along the line, so this line sees the ground from one side and the lines flown the other way from the opposite side.`);
          if (nx) {
            const [lon, lat2] = frame.toLonLat(nx.atX, nx.atY);
            reasons.push(`ground at ${round(nx.groundM, 1)} m above ${datum} between lines ${li + 1} and ${rowNo(it.row + 1) ?? '?'} (lon ${round(lon, 5)}, lat ${round(lat2, 5)}) leaves ${round(nx.halfLeftM, 1)} m and ${round(nx.halfRightM, 1)} m of footprint either side under the ${geometry.rollDeg}° roll: ${round(nx.spacingM, 1)} m spacing keeps the ${round(sideFloor * 100, 0)} % side overlap floor${nx.held ? '' : ' (not held after 7 tries: the raster check decides)'}.`);
          } else reasons.push('last line of the layout: its footprint reaches the area\'s far edge.');
          if (it.cut) {
            const { piece, pieces, before, after } = it.cut;
            const say = (c: LineCut) => {
              const rise = c.gradient >= 0, up = c.stepM >= 0;
              const step = Math.abs(c.stepM) < 0.5 ? 'crosses it at the same altitude' : up ? `climbs ${round(c.stepM, 1)} m straight up at ${mission.climbMps} m/s, then crosses it` : `crosses it, then descends ${round(-c.stepM, 1)} m straight down at ${mission.descentMps} m/s`;
              return `a face ${rise ? 'rising' : 'dropping'} from ${round(c.groundFromM, 1)} to ${round(c.groundToM, 1)} m above ${datum} over ${round(c.toM - c.fromM, 1)} m (steepest ${round(Math.abs(c.gradient), 2)} m per metre): the aircraft stops at its ${rise ? 'foot' : 'top'} and ${step}; ${c.heldM > 0 ? `the GSD band is held over ${round(c.heldM, 0)} m more of the line than the whole line's slowest legs can follow, ` : ''}${c.savedS >= 0 ? `${round(c.savedS, 0)} s less` : `${round(-c.savedS, 0)} s more`} than flying the line whole with slower legs`;
            };
            const ends = it.line.end, starts = it.line.start;
            const [eLon, eLat] = frame.toLonLat(ends[0], ends[1]), [sLon, sLat] = frame.toLonLat(starts[0], starts[1]);
            reasons.push(`part ${piece} of ${pieces} of one line cut at faces${after ? `; it ends (lon ${round(eLon, 5)}, lat ${round(eLat, 5)}) before ${say(after)}` : ''}${before ? `; it starts (lon ${round(sLon, 5)}, lat ${round(sLat, 5)}) after ${say(before)}` : ''}.`);
          }
          reasons.push(`altitude legs under ${round(it.factor * geometry.specHeightM, 1)} m above ground (${round(it.factor * 100, 0)} % of the ${round(geometry.specHeightM, 1)} m that gives the spec's ${spec.maxGsdCm} cm GSD), never below the ${mission.clearanceM + mission.obstacleAllowanceM} m clearance and allowance, under the ${mission.maxAglM} m height limit.`);
          if (it.fitSpeed < mission.speedMps - 1e-9) reasons.push(`at ${mission.speedMps} m/s the climb/descent limits (${mission.climbMps}/${mission.descentMps} m/s) miss the GSD band over ${round(it.slowedForM, 0)} m of this line; legs were fitted for ${round(it.fitSpeed, 2)} m/s (gradients ${round(mission.climbMps / it.fitSpeed, 3)} up, ${round(mission.descentMps / it.fitSpeed, 3)} down) and each flies as fast as its own gradient allows (${round(vMin, 2) === round(vMax, 2) ? round(vMin, 2) : `${round(vMin, 2)}–${round(vMax, 2)}`} m/s).`);
          else reasons.push(`every leg at the mission's ${mission.speedMps} m/s: the climb/descent limits hold the band without slowing.`);
          reasons.push(`photos every ${round(it.trig.minM, 1)}–${round(it.trig.maxM, 1)} m: ${round(it.fwd * 100, 0)} % forward overlap (${it.views} views along the line) over the highest ground under each photo; the tightest where ground reaches ${round(it.trig.tightestGroundM, 1)} m above ${datum}, ${round(it.trig.tightestAtM, 0)} m along.`);
        }
        return {
          line: li + 1, kind: sp ? 'spot' : 'line', set: it ? it.set + 1 : 1, offsetM: it ? round(it.line.offsetM, 2) : NaN, spacingToNextM: row?.next ? round(row.next.spacingM, 2) : null,
          speedMps: { min: round(vMin, 2), max: round(vMax, 2) },
          triggerDistanceM: { min: it ? round(it.trig.minM, 2) : 0, max: it ? round(it.trig.maxM, 2) : 0 },
          legs: pl.legs.length, reasons,
        };
      });
      const flightTimeS = flightTimeWithLegSpeedsS(plan, mission);
      // transits to, from and between spot photos flown straight at the higher end that come inside the clearance
      // (the tour avoids them where it can; a plan that has any is kept only when no other meets the spec)
      let unsafeSpotHops = 0;
      for (let li = 0; li + 1 < plan.lines.length; li++) {
        if (!kept[li].spot && !kept[li + 1].spot) continue;
        const a = plan.lines[li].legs, b = plan.lines[li + 1].legs;
        const alt = Math.max(a[a.length - 1]?.altitudeEndM ?? NaN, b[0]?.altitudeStartM ?? NaN);
        if (transitShortfallM(kept[li].line.end, kept[li + 1].line.start, alt, heights.heightAt, mission.clearanceM + mission.obstacleAllowanceM, 1) > 0) unsafeSpotHops++;
      }
      const out: Built = { plan, rows: rowsBySet, choices, flightTimeS, unsafeSpotHops, full: () => (overlaps ? out : finish(true)) };
      return out;
    };
    // candidates are analysed without overlaps (no choice reads them: the raster decides), the chosen one in full
    return finish(opts.candidatesInFull ?? false);
  };
  // 1. heading: the candidate whose layout flies fastest
  const none = (): Repairs[] => Array.from({ length: setCount }, () => ({ lower: [], views: [] }));
  let headingDeg = headings[0];
  let built = build(headingDeg, none());
  const tried: string[] = [`${headingDeg}°: ${round(built.flightTimeS, 0)} s`];
  for (const h of headings.slice(1)) {
    const b = build(h, none());
    tried.push(`${h}°: ${round(b.flightTimeS, 0)} s`);
    if (b.flightTimeS < built.flightTimeS) { built = b; headingDeg = h; }
  }
  // 2. prove, and tighten where reachable cells fall short: in each set, the row nearest the short cell; 3. close
  // what each round leaves short with spot photos, and keep the round whose lines and spots fly fastest (lowering a
  // whole line costs more than spot photos over a few short cells beside it, and less than spots over thousands)
  const rots = Array.from({ length: setCount }, (_, set) => rotated(setHeadingOf(headingDeg, set)));
  const rep = none();
  let verdict: Verdict = verifier.check(built.plan);
  let rounds = 0;
  const snapshot = (r: Repairs[]): Repairs[] => r.map((q) => ({ lower: [...q.lower], views: [...q.views] }));
  /**
   * One round's lines closed with spot photos: one straight above each cell still short, lower again where a spot
   * of an earlier spot round did not do; given as far as it got once it flies slower than `bound`, when that meets the spec.
   */
  const withSpots = (c: Candidate, bound: Candidate | null): Candidate => {
    let { built: b0, verdict: v0 } = c;
    let spots: Spot[] = [];
    let spotRounds = 0;
    while (!v0.meets && spotRounds < so.spotRounds) {
      const short = v0.failing.filter((f) => f.item === 'gsd' || f.item === 'views').map((f) => ({ x: cellX(verifier.cells, f.cell), y: cellY(verifier.cells, f.cell), z: verifier.cells.z[f.cell], slopeDeg: verifier.reach.slopeDeg[f.cell], finestGsdCm: v0.raster.finestGsdCm[f.cell], item: f.item === 'gsd' ? 'gsd' as const : 'views' as const }));
      if (short.length === 0) break;
      spotRounds++;
      const added = placeSpots(short, geometry, mission, 0.95, spots, heights.heightAt, headingDeg);
      if (added.length === 0) break;
      // a lower spot replaces the earlier one over the same cell
      const next = [...spots.filter((s0) => !added.some((a) => a.x === s0.x && a.y === s0.y)), ...added];
      const b = build(headingDeg, c.rep, next);
      // slower than a plan that meets the spec already: more or lower spots only add time
      if (bound && b.flightTimeS >= bound.built.flightTimeS) break;
      // the round's lines are the checked layout's own: only the ground the spots may see is worked out again
      // (every candidate in full: the whole raster, which the tests compare with)
      const v = opts.candidatesInFull ? verifier.check(b.plan) : verifier.checkAdding(b.plan, { plan: c.built.plan, verdict: c.verdict });
      if (v.failing.length >= v0.failing.length) break;
      b0 = b; v0 = v; spots = next;
    }
    return { built: b0, verdict: v0, rep: c.rep, round: c.round, spots: spots.length };
  };
  /**
   * Whether `a` is a better outcome than `b`: it meets the spec with every spot transit clear and `b` does not,
   * else both alike and `a` flies faster (when they meet) or leaves fewer cells short.
   */
  const sound = (c: Candidate) => c.verdict.meets && c.built.unsafeSpotHops === 0;
  const better = (a: Candidate, b: Candidate) => sound(a) !== sound(b) ? sound(a)
    : a.verdict.meets !== b.verdict.meets ? a.verdict.meets
      : a.verdict.meets ? a.built.flightTimeS < b.built.flightTimeS : a.verdict.failing.length < b.verdict.failing.length;
  const rounded: Candidate[] = [{ built, verdict, rep: snapshot(rep), round: 0 }];
  let fewestShort = verdict.failing.length;
  while (!verdict.meets && rounds < so.repairRounds) {
    rounds++;
    for (let set = 0; set < setCount; set++) {
      const offsets = built.rows[set].map((r) => r.offsetM);
      const hitLower = new Set<number>(), hitViews = new Set<number>();
      for (const f of verdict.failing) {
        const c = rots[set].c(cellX(verifier.cells, f.cell), cellY(verifier.cells, f.cell));
        let k = 0;
        for (let j = 1; j < offsets.length; j++) if (Math.abs(offsets[j] - c) < Math.abs(offsets[k] - c)) k = j;
        // too few views, or too few sides: more photos along the nearest rows
        (f.item === 'gsd' ? hitLower : hitViews).add(k);
      }
      for (const k of hitLower) rep[set].lower.push(offsets[k]);
      for (const k of hitViews) rep[set].views.push(offsets[k]);
    }
    const last = rounded[rounded.length - 1];
    built = build(headingDeg, rep);
    // the same photos as the last round (more views asked along lines whose forward overlap the slant already
    // sets): the same raster, so the same verdict, and nothing new to close with spots
    if (verifier.samePhotos(built.plan, last.built.plan)) { verdict = last.verdict; continue; }
    verdict = verifier.check(built.plan);
    rounded.push({ built, verdict, rep: snapshot(rep), round: rounds });
    // a round that left more cells short than an earlier one lowered lines past where it helps
    if (!verdict.meets && verdict.failing.length > fewestShort) break;
    fewestShort = Math.min(fewestShort, verdict.failing.length);
  }
  // closed with spots, the round with the fewest cells short first: its time bounds the others, whose spots are
  // then checked only while they fly faster
  let best: Candidate | null = null;
  const outcomes: string[] = [];
  for (const c of [...rounded].sort((a, b) => a.verdict.failing.length - b.verdict.failing.length || a.built.flightTimeS - b.built.flightTimeS)) {
    const lines = `round ${c.round}: lines ${round(c.built.flightTimeS, 0)} s leaving ${c.verdict.failing.length} cell${c.verdict.failing.length === 1 ? '' : 's'} short`;
    if (best && sound(best) && c.built.flightTimeS >= best.built.flightTimeS) { outcomes[c.round] = `${lines} (no faster)`; continue; }
    const closed = withSpots(c, best && sound(best) ? best : null);
    const n = closed.spots ?? 0;
    const spotted = `${n} spot photo${n === 1 ? '' : 's'}`;
    outcomes[c.round] = `${lines}${c.verdict.meets ? '' : sound(closed) ? `, with ${spotted}: ${round(closed.built.flightTimeS, 0)} s`
      : closed.verdict.meets ? `, with ${spotted} whose transits come inside the clearance`
        : best && sound(best) ? ', slower with spot photos than the best so far' : n === 0 ? '' : `, with ${spotted} still ${closed.verdict.failing.length} short`}`;
    if (!best || better(closed, best)) best = closed;
  }
  const kept = best!;
  const unchanged = `${rounds} tightening round${rounds === 1 ? '' : 's'} changed no photo (more views were asked along lines whose photo spacing another floor already sets)`;
  const tightening = rounded.length === 1
    ? (rounds === 0 && rounded[0].verdict.meets ? 'the first layout meets the spec: no tightening round.'
      : rounds === 0 ? `no tightening round (solve.repairRounds is 0): ${outcomes[0]}.`
        : `${unchanged}: ${outcomes[0]}.`)
    : `round ${kept.round} of ${rounds} kept, ${sound(kept) ? 'the fastest that meets the spec' : kept.verdict.meets ? 'the fastest that meets the spec, although a spot transit comes inside the clearance (see the warnings)' : 'the one that leaves the fewest cells short'}: each round lowers the lines nearest the cells the last one left short of the GSD and adds photos along those short of views, and what a round leaves short is closed with spot photos. ${outcomes.filter(Boolean).join('; ')}.`;
  ({ built, verdict } = kept);
  // the chosen layout with every figure: the same lines, stations and legs (so the same raster and verdict)
  built = built.full();
  // 4. the yardstick: uniform settings; fall back when one meets the spec in no more time (or the solved plan does not meet it)
  const own: UniformSetting = { forwardOverlap: mission.forwardOverlap, sideOverlap: mission.sideOverlap, mode: mission.mode, headingDeg: typeof mission.headingDeg === 'number' ? mission.headingDeg : headingDeg };
  // the mission's own overlaps in each altitude mode, and any settings the caller adds
  const modes = (['hold', 'steps', 'follow'] as const).filter((m) => m !== own.mode).map((mode) => ({ ...own, mode }));
  // analysed all; rasters only for those that could win (no slower than the solved plan, or all when it falls short)
  const checkedUniform = bestUniform(grid, inputObj, [own, ...modes, ...(opts.uniform ?? [])], verifier, { ...opts, overlaps: opts.candidatesInFull ?? false }, { maxChecks: 0 }).outcomes;
  const uniformVerdicts = new Map<UniformOutcome, Verdict>();
  for (const o of checkedUniform) {
    if (verdict.meets && o.flightTimeS > built.flightTimeS) continue;
    // only whether it meets the spec decides: its raster stops at its first short cell
    // (the sweep here is not lean: every outcome keeps its plan)
    const plan = o.plan!;
    const v = opts.candidatesInFull ? verifier.check(plan) : verifier.verdictIfMeets(plan);
    if (v) uniformVerdicts.set(o, v);
    o.meets = v ? v.meets : false; o.shareReachable = v ? v.compliance.shareAll : null;
  }
  const meetingUniform = checkedUniform.filter((o) => o.meets).sort((a, b) => a.flightTimeS - b.flightTimeS)[0] ?? null;
  let plan = built.plan;
  let flightTimeS = built.flightTimeS;
  let fallback: string | null = null;
  let choiceLines = built.choices;
  if (meetingUniform && (!verdict.meets || meetingUniform.flightTimeS <= flightTimeS)) {
    const u: UniformOutcome = meetingUniform;
    fallback = `the uniform setting (forward ${round(u.setting.forwardOverlap * 100, 0)} %, side ${round(u.setting.sideOverlap * 100, 0)} %, ${u.setting.mode}, ${u.setting.headingDeg}°) meets the spec in ${round(u.flightTimeS, 0)} s, ${verdict.meets ? `no more than the solved layout's ${round(flightTimeS, 0)} s` : 'and the solved layout does not meet it'}: it is returned instead.`;
    // the yardstick was analysed without overlaps: the plan returned carries them
    plan = analysePlan(grid, { ...inputObj, ...u.setting }, { verticalDatum: opts.verticalDatum });
    flightTimeS = u.flightTimeS;
    // its photos are the checked plan's own, so its verdict stands
    verdict = uniformVerdicts.get(u)!;
    choiceLines = [];
  }
  plan.summary.flightTimeS = round(flightTimeS, 1);
  if (!fallback && choiceLines.length > 0) {
    // spacing and photo spacing vary by line: the summary gives the tightest of each (every line's own in choices),
    // and the height the bands are topped at
    const layoutLines = choiceLines.filter((c) => c.kind === 'line');
    const gaps = layoutLines.map((c) => c.spacingToNextM).filter((v): v is number => v !== null);
    if (gaps.length) plan.summary.lineSpacingM = Math.min(...gaps);
    if (layoutLines.length) plan.summary.triggerDistanceM = Math.min(...layoutLines.map((c) => c.triggerDistanceM.min));
    plan.summary.plannedHeightM = round(geometry.specHeightM * 0.97, 3);
  }
  const usable = mission.enduranceMin * 60 * (1 - mission.batteryReserve);
  plan.summary.batteries = Math.max(1, Math.ceil(flightTimeS / usable - 1e-9));
  const unreachable = unreachableGroups(verifier, spec.maxGsdCm, mission);
  const reachableCells = verifier.cells.insideCount - unreachable.reduce((t, g) => t + g.cells, 0);
  const bestUni = meetingUniform ? meetingUniform.flightTimeS : null;
  return {
    ...plan,
    pattern,
    choices: {
      headingDeg,
      heading: `${headingDeg}° flies fastest of ${headingWhy}: ${tried.join(', ')}.`,
      pattern: (pattern === 'slant'
        ? `slant: two sets of parallel lines a quarter turn apart (${headingDeg}° and ${setHeadingOf(headingDeg, 1)}°), the camera tilted ${tiltDeg}° from straight down towards the nose on every line, so each line looks one way along it and the lines flown each way of both sets see every point from four headings; lines fly at cos² ${tiltDeg}° = ${round(tiltFactor, 3)} of the nadir height for the GSD at the image centre; each set with half the spec's views (${viewsPerSet})${so.pattern === 'slant' ? ' (the mission asks for it)' : ` (the spec asks for views from all round at ${spec.obliqueDeg}° from the vertical, a slant nadir photos from neighbouring lines cannot give with this camera)`}.`
        : lattice
        ? `lattice: a second set of parallel lines across the first (${headingDeg}° and ${setHeadingOf(headingDeg, 1)}°), nadir camera, each set with half the spec's views (${viewsPerSet}), so every point is seen from four sides${so.pattern === 'lattice' ? ' (the mission asks for it)' : ` (the spec asks for views from all round: no gap over ${spec.maxDirectionGapDeg}° between views at least ${spec.obliqueDeg}° from the vertical)`}.`
        : `furrow: one set of parallel lines, nadir camera (mapping)${spec.maxDirectionGapDeg !== null ? '; the mission asks for it although the spec asks for views from all round, which one set seldom gives (the proof shows where)' : ''}.`)
        + (so.beyondEdgeM > 0 ? ` Lines are laid up to ${so.beyondEdgeM} m beyond the area's boundary (solve.beyondEdgeM), so ground at the edge is seen from outside too: fly there only where that is allowed.` : ''),
      lines: choiceLines,
      fallback,
      tightening,
      summary: fallback
        ? 'the summary is the uniform plan\'s own.'
        : 'summary.lineSpacingM and summary.triggerDistanceM are the tightest line spacing and photo spacing (each line\'s own are in choices.lines); summary.plannedHeightM is the height above ground the GSD bands are topped at; the GSD band is the spec\'s (finer is never a fault); overlaps are checked against the solver\'s floors.',
    },
    unreachable,
    proof: {
      cellM: round(verifier.cellM, 3), cellsInArea: verifier.cells.insideCount, reachableCells,
      shareReachableMeeting: round(verdict.compliance.shareAll, 6), meets: verdict.meets,
      items: verdict.compliance.items.map((it) => ({ item: it.item, asks: it.asks, share: round(it.share, 6) })),
      shortCells: verdict.failing.length,
      short: shortGroups(verifier, verdict, spec.maxGsdCm, rounds, so.beyondEdgeM),
      basis: envelope ? 'coverage raster of the solved plan, guaranteed under the attitude envelope' : 'coverage raster of the solved plan, as planned (no attitude envelope in the mission)',
    },
    comparison: {
      uniform: checkedUniform.map((o) => ({ setting: o.setting, flightTimeS: o.flightTimeS, photoCount: o.photoCount, batteries: Math.max(1, Math.ceil(o.flightTimeS / usable - 1e-9)), shareReachable: o.shareReachable === null ? null : round(o.shareReachable, 6), meets: o.meets })),
      bestUniformFlightTimeS: bestUni,
      solvedFlightTimeS: round(flightTimeS, 1),
      ratio: bestUni ? round(flightTimeS / bestUni, 4) : null,
    },
    rounds,
  };
}

/** Short cells grouped by item, with the slopes under them. */
function shortGroups(v: Verifier, verdict: Verdict, maxGsdCm: number, rounds: number, beyondEdgeM: number): ShortGroup[] {
  const out: ShortGroup[] = [];
  for (const item of ['gsd', 'views', 'directions', 'other'] as const) {
    const cells = verdict.failing.filter((f) => f.item === item).map((f) => f.cell);
    if (cells.length === 0) continue;
    let sx = 0, sy = 0, lo = Infinity, hi = -Infinity, worst = 0;
    for (const i of cells) {
      sx += cellX(v.cells, i); sy += cellY(v.cells, i);
      const b = v.reach.slopeDeg[i];
      if (b < lo) lo = b;
      if (b > hi) hi = b;
      const g = verdict.raster.finestGsdCm[i];
      worst = Number.isFinite(g) ? Math.max(worst, g) : Infinity;
    }
    const [lon, lat] = v.frame.toLonLat(sx / cells.length, sy / cells.length);
    const steep = lo >= 30;
    const after = `after ${rounds} tightening round${rounds === 1 ? '' : 's'}`;
    out.push({
      item, cells: cells.length, areaM2: round(cells.length * v.cells.cellAreaM2, 1), slopeDeg: { min: round(lo, 1), max: round(hi, 1) },
      centroid: { lon: round(lon, 7), lat: round(lat, 7) },
      message: item === 'gsd'
        ? `no view at or finer than ${maxGsdCm} cm ${after} (finest there up to ${Number.isFinite(worst) ? `${round(worst, 2)} cm` : 'none'}) on ground sloping ${round(lo, 0)}–${round(hi, 0)}°${steep ? ': steep faces that nadir photos from lines beside them see too obliquely; a line straight over the face or a tilted camera is needed' : ''}.`
        : item === 'views' ? `fewer views than the spec asks ${after} (terrain hides them, or the strip edges under the envelope).`
          : item === 'directions' ? `seen from too few sides ${after}: the oblique views leave a wider gap between their directions than the spec allows (near the area's edge a point has lines on one side only${beyondEdgeM > 0 ? '' : ': where flying over the neighbouring ground is allowed, let lines fly past the edge (solve.beyondEdgeM; "Lines may fly past the edge by" in the plan editor)'}; terrain can hide one side).`
          : `the advisory σ items are not met here ${after} (the solver does not steer by them).`,
    });
  }
  return out;
}

/** Unreachable cells grouped by reason, with a message naming the numbers. */
function unreachableGroups(v: Verifier, maxGsdCm: number, m: Mission): UnreachableGroup[] {
  const out: UnreachableGroup[] = [];
  const { cells, reach, frame } = v;
  for (const code of [1, 2] as const) {
    let n = 0, sx = 0, sy = 0, slopeMax = 0;
    for (let i = 0; i < reach.code.length; i++) {
      if (!cells.inside[i] || reach.code[i] !== code) continue;
      n++; sx += cellX(cells, i); sy += cellY(cells, i);
      if (code === 2 && reach.slopeDeg[i] > slopeMax) slopeMax = reach.slopeDeg[i];
    }
    if (n === 0) continue;
    const [lon, lat] = frame.toLonLat(sx / n, sy / n);
    const low = m.clearanceM + m.obstacleAllowanceM;
    out.push({
      reason: code === 1 ? 'ground-unknown' : 'slope-gsd',
      message: code === 1
        ? 'the elevation grid has no height here: no altitude can be proven safe and no GSD computed.'
        : `ground sloping up to ${round(slopeMax, 1)}°: even a photo straight above at the ${low} m clearance and allowance gives a GSD coarser than the spec's ${maxGsdCm} cm along the slope; the clearance forbids flying lower (a camera pointed square at the face would be needed).`,
      cells: n, areaM2: round(n * cells.cellAreaM2, 1), centroid: { lon: round(lon, 7), lat: round(lat, 7) },
    });
  }
  return out;
}

