/**
 * The same-day re-flight as stretches of the lines already signed off: for each re-flight area, the stretch of
 * every signed-off line that runs through it, with that line's own legs and heights clipped to the stretch.
 * A pilot can fly these at once: they are parts of the reviewed plan, at its reviewed heights, so nothing new
 * needs a sign-off. Lines a re-flight area adds beyond the plan's outer lines are not part of it and are only
 * counted (they fly after the re-flight is saved as a plan and signed off).
 */
import type { LocalFrame } from './local-frame';
import type { PlanLine, PlanResult } from './plan-result';
import type { ReflightArea } from './reflight';

const DEG = Math.PI / 180;

/** One leg of a stretch: the signed-off leg's straight climb or descent between two distances along its line. */
export interface StretchLeg {
  fromM: number;
  toM: number;
  altitudeStartAboveTakeoffM: number;
  altitudeEndAboveTakeoffM: number;
  altitudeStartM: number;
  altitudeEndM: number;
}

/** One stretch of one signed-off line. */
export interface ReflightStretch {
  /** Re-flight area it mends (1-based, as in the re-flight's area list). */
  area: number;
  /** Line number on the signed-off leg sheet (1-based, flying order). */
  line: number;
  /** Distances along the line from its start (metres), and the stretch's length. */
  fromM: number;
  toM: number;
  lengthM: number;
  headingDeg: number;
  start: { lon: number; lat: number };
  end: { lon: number; lat: number };
  /** The line's photo stations inside the stretch (1-based within the line), and how many. */
  firstPhoto: number | null;
  lastPhoto: number | null;
  photos: number;
  legs: StretchLeg[];
  /** Time on the stretch at the line's speed (s). */
  timeS: number;
}

export interface ReflightStretches {
  stretches: ReflightStretch[];
  /** Lines the re-flight areas add beyond the signed-off plan's outer lines (not flyable without a new sign-off). */
  offPlanLines: number;
  lengthM: number;
  timeS: number;
  photos: number;
}

/** Along-distance of a line's point at `d` in the heading frame, and the line's across offset. */
function lineFrame(line: PlanLine, frame: LocalFrame, sin: number, cos: number) {
  const [xs, ys] = frame.toLocal(line.start.lon, line.start.lat);
  const [xe, ye] = frame.toLocal(line.end.lon, line.end.lat);
  const aS = xs * sin + ys * cos, aE = xe * sin + ye * cos;
  const c = ((xs * cos - ys * sin) + (xe * cos - ye * sin)) / 2;
  return { xs, ys, ux: (xe - xs) / line.lengthM, uy: (ye - ys) / line.lengthM, aS, dir: aE >= aS ? 1 : -1, c };
}

/** Linear height along a leg at distance d. */
function at(d: number, s: number, e: number, hs: number, he: number): number {
  return e > s ? hs + ((he - hs) * (d - s)) / (e - s) : hs;
}

/**
 * Stretches of `plan`'s lines (the signed-off plan, as analysed) through each re-flight area, in the areas'
 * order and, within an area, in the plan's flying order. `frame` is the local frame the areas were laid in.
 */
export function reflightStretches(plan: PlanResult, frame: LocalFrame, areas: readonly ReflightArea[], speedMps: number): ReflightStretches {
  const h = plan.summary.headingDeg * DEG;
  const sin = Math.sin(h), cos = Math.cos(h);
  const S = plan.summary.lineSpacingM;
  const geo = plan.lines.map((l) => lineFrame(l, frame, sin, cos));
  const stretches: ReflightStretch[] = [];
  let offPlanLines = 0;
  areas.forEach((area, k) => {
    const { alongFromM: a0, alongToM: a1, acrossFromM: c0, acrossToM: c1 } = area.box;
    const positions = Math.max(1, Math.round((c1 - c0) / S));
    let found = 0;
    plan.lines.forEach((line, li) => {
      const g = geo[li];
      if (!(g.c >= c0 && g.c <= c1) || !(line.lengthM > 0)) return;
      found++;
      const d0 = Math.max(0, Math.min((a0 - g.aS) * g.dir, (a1 - g.aS) * g.dir));
      const d1 = Math.min(line.lengthM, Math.max((a0 - g.aS) * g.dir, (a1 - g.aS) * g.dir));
      if (!(d1 > d0)) return;
      const inside = line.stations.map((s, i) => ({ s, i })).filter(({ s }) => s.distanceM >= d0 - 1e-6 && s.distanceM <= d1 + 1e-6);
      const legs: StretchLeg[] = [];
      for (const leg of line.legs) {
        const s = leg.start.distanceM, e = leg.end.distanceM;
        const from = Math.max(s, d0), to = Math.min(e, d1);
        if (!(to > from)) continue;
        legs.push({
          fromM: from, toM: to,
          altitudeStartAboveTakeoffM: at(from, s, e, leg.altitudeStartAboveTakeoffM, leg.altitudeEndAboveTakeoffM),
          altitudeEndAboveTakeoffM: at(to, s, e, leg.altitudeStartAboveTakeoffM, leg.altitudeEndAboveTakeoffM),
          altitudeStartM: at(from, s, e, leg.altitudeStartM, leg.altitudeEndM),
          altitudeEndM: at(to, s, e, leg.altitudeStartM, leg.altitudeEndM),
        });
      }
      const point = (d: number) => { const [lon, lat] = frame.toLonLat(g.xs + g.ux * d, g.ys + g.uy * d); return { lon, lat }; };
      const timeS = legs.reduce((t, lg) => {
        const src = line.legs.find((x) => x.start.distanceM <= lg.fromM + 1e-9 && x.end.distanceM >= lg.toM - 1e-9);
        return t + (lg.toM - lg.fromM) / (src?.speedMps ?? speedMps);
      }, 0);
      stretches.push({
        area: k + 1, line: li + 1, fromM: d0, toM: d1, lengthM: d1 - d0, headingDeg: line.headingDeg,
        start: point(d0), end: point(d1),
        firstPhoto: inside.length ? inside[0].i + 1 : null, lastPhoto: inside.length ? inside[inside.length - 1].i + 1 : null, photos: inside.length,
        legs, timeS,
      });
    });
    offPlanLines += Math.max(0, positions - found);
  });
  return {
    stretches, offPlanLines,
    lengthM: stretches.reduce((t, s) => t + s.lengthM, 0),
    timeS: stretches.reduce((t, s) => t + s.timeS, 0),
    photos: stretches.reduce((t, s) => t + s.photos, 0),
  };
}
