/**
 * Battery plan: lines in flying order packed greedily into battery packs. Each pack flies out from the takeoff point
 * to its first line, its lines with a turn between each, and back; a pack closes when the next line would push it past
 * the usable time (endurance less the reserve). Transits are straight at the cruise speed, in still air; between lines
 * the caller may give each line's transit from the one before (spot photos are reached that way). Each pack climbs
 * off the takeoff point to its first line's altitude and descends back onto it from its last line's, straight up and
 * down at the vertical speeds (as the MAVLink export flies it: take off to the altitude, then out; back, then land),
 * when the caller gives those altitudes and speeds.
 */
import type { BatteryPlan } from '../../contracts/flights';

export interface BatteryLine {
  number: number;
  /** Time on the line itself, seconds. */
  timeS: number;
  /** Straight distance from the takeoff point to the line's start and from its end, metres. */
  fromTakeoffM: number;
  toTakeoffM: number;
  /** Transit from the end of the line before it in flying order, seconds (0 when not known): added on top of the turn. */
  fromPreviousS?: number;
  /** Altitude above the takeoff point at the line's start and at its end, metres (the climb out and the descent back). */
  startAboveTakeoffM?: number;
  endAboveTakeoffM?: number;
  /** Altitude above takeoff the straight way home from the line's end keeps the clearance at (the plan's; at least the end's): climbed to before heading home. */
  returnAboveTakeoffM?: number;
}

interface BatteryOptions {
  enduranceMin: number;
  /** Fraction of each battery kept in reserve (0.25 = land with a quarter left). */
  reserve: number;
  speedMps: number;
  turnTimeS: number;
  /** Vertical speeds for the climb off and the descent onto the takeoff point, m/s (left out: not counted). */
  climbMps?: number;
  descentMps?: number;
}

/** Pack the lines into batteries; throws on impossible options (expected vs got). */
export function planBatteries(lines: readonly BatteryLine[], o: BatteryOptions): BatteryPlan {
  if (!(o.enduranceMin > 0)) throw new RangeError(`enduranceMin must be positive, got ${o.enduranceMin}`);
  if (!(o.reserve >= 0 && o.reserve < 1)) throw new RangeError(`reserve must be in [0, 1), got ${o.reserve}`);
  if (!(o.speedMps > 0)) throw new RangeError(`speedMps must be positive, got ${o.speedMps}`);
  if (!(o.turnTimeS >= 0)) throw new RangeError(`turnTimeS must be zero or more, got ${o.turnTimeS}`);
  if (o.climbMps !== undefined && !(o.climbMps > 0)) throw new RangeError(`climbMps must be positive, got ${o.climbMps}`);
  if (o.descentMps !== undefined && !(o.descentMps > 0)) throw new RangeError(`descentMps must be positive, got ${o.descentMps}`);
  const usable = o.enduranceMin * 60 * (1 - o.reserve);
  // a change of height dz (m, up positive) flown straight up or down
  const vertical = (dz: number | undefined) => {
    if (dz === undefined || !Number.isFinite(dz) || o.climbMps === undefined || o.descentMps === undefined) return 0;
    return dz > 0 ? dz / o.climbMps : -dz / o.descentMps;
  };
  const outS = (l: BatteryLine) => vertical(l.startAboveTakeoffM) + l.fromTakeoffM / o.speedMps;
  // home at the plan's return altitude where the way needs it: climb over the line's end first, then descend from there
  const homeAlt = (l: BatteryLine) => (l.endAboveTakeoffM === undefined ? undefined : Math.max(l.endAboveTakeoffM, l.returnAboveTakeoffM ?? -Infinity));
  const backS = (l: BatteryLine) => {
    const home = homeAlt(l);
    return (home === undefined ? 0 : vertical(home - l.endAboveTakeoffM!) + vertical(-home)) + l.toTakeoffM / o.speedMps;
  };
  const packs: BatteryPlan['packs'] = [];
  const notes: string[] = [];
  let cur: { lines: BatteryLine[]; timeS: number } | null = null;

  const close = () => {
    if (!cur) return;
    const last = cur.lines[cur.lines.length - 1];
    const flightTimeS = cur.timeS + backS(last);
    const home = homeAlt(last);
    packs.push({ number: packs.length + 1, lines: cur.lines.map((l) => l.number), flightTimeS, overBudget: flightTimeS > usable + 1e-9, ...(home !== undefined && Number.isFinite(home) ? { homeAboveTakeoffM: home, homeClimbM: Math.max(0, home - last.endAboveTakeoffM!) } : {}) });
    cur = null;
  };

  for (const line of lines) {
    if (cur) {
      const step = o.turnTimeS + (line.fromPreviousS ?? 0) + line.timeS;
      const withLine = cur.timeS + step + backS(line);
      if (withLine <= usable + 1e-9) {
        cur.timeS += step;
        cur.lines.push(line);
        continue;
      }
      close();
    }
    cur = { lines: [line], timeS: outS(line) + line.timeS };
  }
  close();

  for (const p of packs) {
    if (p.overBudget) {
      notes.push(`Line ${p.lines[0]} alone needs ${(p.flightTimeS / 60).toFixed(1)} min with its transits, more than one battery's usable ${(usable / 60).toFixed(1)} min: fly it in parts or shorten it.`);
    }
  }
  const climbs = o.climbMps !== undefined && o.descentMps !== undefined;
  notes.push(`Each pack assumes still air and a straight transit from and back to the takeoff point at ${o.speedMps} m/s${climbs ? `, with the climb off it to the first line's altitude at ${o.climbMps} m/s and the descent back onto it at ${o.descentMps} m/s` : ''}; wind changes these times.`);
  return { enduranceMin: o.enduranceMin, reserve: o.reserve, usablePerBatteryS: usable, count: packs.length, packs, notes };
}
