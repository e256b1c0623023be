/** Waypoints of a plan version: each line's start, every change of leg and each line's end, in flying order. */
import type { DatumKind, Waypoint } from '../../contracts/exports';
import type { LegView, ResultView } from '../versions/result-view';
import { heightsOf } from './datum';

function samePoint(a: LegView['end'], b: LegView['start']): boolean {
  return Math.abs(a.lon - b.lon) < 1e-9 && Math.abs(a.lat - b.lat) < 1e-9;
}

/** All waypoints; consecutive legs that meet at the same place and altitude share one waypoint. */
export function waypointsOf(view: ResultView, datum: { name: string; kind: DatumKind }): Waypoint[] {
  const out: Waypoint[] = [];
  view.lines.forEach((line, li) => {
    const lineNo = li + 1;
    const add = (p: LegView['start'], leg: number, role: Waypoint['role'], aboveTakeoff: number, aboveDatum: number) => {
      out.push({
        seq: out.length + 1,
        line: lineNo,
        leg,
        role,
        lon: p.lon,
        lat: p.lat,
        distanceM: p.distanceM,
        altitudeAboveTakeoffM: aboveTakeoff,
        altitudeAboveDatumM: aboveDatum,
        verticalDatum: datum.name,
        ...heightsOf(datum.kind, p.lat, p.lon, aboveDatum),
      });
    };
    line.legs.forEach((leg, gi) => {
      add(leg.start, gi + 1, gi === 0 ? 'line-start' : 'leg-change', leg.altitudeStartAboveTakeoffM, leg.altitudeStartM);
      const next = line.legs[gi + 1];
      const joined = next && samePoint(leg.end, next.start) && Math.abs(leg.altitudeEndM - next.altitudeStartM) < 1e-6;
      if (!next) add(leg.end, gi + 1, 'line-end', leg.altitudeEndAboveTakeoffM, leg.altitudeEndM);
      else if (!joined) add(leg.end, gi + 1, 'leg-change', leg.altitudeEndAboveTakeoffM, leg.altitudeEndM);
    });
  });
  return out;
}
