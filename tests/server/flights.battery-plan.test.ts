import { describe, expect, it } from 'vitest';
import { planBatteries, type BatteryLine } from '../../server/flights/battery-plan';

// Worked by hand: 10 min endurance, 20 % reserve -> 480 s usable per battery; 10 m/s; 10 s per turn.
const opts = { enduranceMin: 10, reserve: 0.2, speedMps: 10, turnTimeS: 10 };
const line = (number: number, timeS: number, fromTakeoffM = 300, toTakeoffM = 300): BatteryLine => ({ number, timeS, fromTakeoffM, toTakeoffM });

describe('the battery plan', () => {
  it('packs lines in flying order until the next would pass the usable time', () => {
    // Pack 1: 30 s out + 100 + 10 + 100 + 10 + 100 = 350 s, + 30 s back = 380 s; a fourth line would make 490 s > 480 s.
    const plan = planBatteries([line(1, 100), line(2, 100), line(3, 100), line(4, 100), line(5, 100)], opts);
    expect(plan.usablePerBatteryS).toBe(480);
    expect(plan.packs.map((p) => p.lines)).toEqual([[1, 2, 3], [4, 5]]);
    expect(plan.packs[0].flightTimeS).toBeCloseTo(380, 9);
    // Pack 2: 30 + 100 + 10 + 100 + 30 = 270 s.
    expect(plan.packs[1].flightTimeS).toBeCloseTo(270, 9);
    expect(plan.count).toBe(2);
    expect(plan.packs.every((p) => !p.overBudget)).toBe(true);
  });

  it('adds each line\'s transit from the one before on top of the turn', () => {
    // Pack 1: 30 + 100 + (10 + 60) + 100 = 300 s, + 30 back = 330 s; a third line would make 300 + (10 + 60) + 100
    // + 30 = 500 s > 480 s (without the transits all three fit: 380 s). Pack 2: 30 + 100 + 30 = 160 s (a pack's
    // first line is reached from the takeoff).
    const plan = planBatteries([1, 2, 3].map((n) => ({ ...line(n, 100), fromPreviousS: 60 })), opts);
    expect(plan.packs.map((p) => p.lines)).toEqual([[1, 2], [3]]);
    expect(plan.packs[0].flightTimeS).toBeCloseTo(330, 9);
    expect(plan.packs[1].flightTimeS).toBeCloseTo(160, 9);
  });

  it('flags a line that alone needs more than one battery', () => {
    const plan = planBatteries([line(1, 100), line(2, 500)], opts);
    expect(plan.packs.map((p) => [p.lines, p.overBudget])).toEqual([[[1], false], [[2], true]]);
    expect(plan.notes[0]).toMatch(/^Line 2 alone needs 9\.3 min/);
  });

  it('counts each pack\'s climb off the takeoff point and its descent back onto it at the vertical speeds', () => {
    // Worked by hand, 3 m/s up and 2 m/s down: lines start 90 m and end 100 m above takeoff. Pack 1: 90 / 3 = 30 s
    // up + 30 s out + 100 + 10 + 100 + 10 + 100 = 380 s, + 30 s back + 100 / 2 = 50 s down = 460 s; a fourth line
    // would make 380 + 110 + 80 = 570 s > 480 s.
    const up = (n: number, t: number): BatteryLine => ({ ...line(n, t), startAboveTakeoffM: 90, endAboveTakeoffM: 100 });
    const vert = { ...opts, climbMps: 3, descentMps: 2 };
    const plan = planBatteries([up(1, 100), up(2, 100), up(3, 100), up(4, 100)], vert);
    expect(plan.packs.map((p) => p.lines)).toEqual([[1, 2, 3], [4]]);
    expect(plan.packs[0].flightTimeS).toBeCloseTo(460, 9);
    // pack 2: 30 up + 30 out + 100 + 30 back + 50 down = 240 s
    expect(plan.packs[1].flightTimeS).toBeCloseTo(240, 9);
    // 100 + 100 + 190 fits one battery flat (30 + 100 + 10 + 100 + 10 + 190 + 30 = 470 s) but not with the climb and descent (550 s)
    expect(planBatteries([line(1, 100), line(2, 100), line(3, 190)], opts).count).toBe(1);
    expect(planBatteries([up(1, 100), up(2, 100), up(3, 190)], vert).packs.map((p) => p.lines)).toEqual([[1, 2], [3]]);
    // a line below the takeoff point (a pit): the aircraft descends to it and climbs back
    const pit = planBatteries([{ ...line(1, 100), startAboveTakeoffM: -20, endAboveTakeoffM: -30 }], vert);
    expect(pit.packs[0].flightTimeS).toBeCloseTo(20 / 2 + 30 + 100 + 30 + 30 / 3, 9);
    expect(pit.notes.at(-1)).toMatch(/climb off it to the first line's altitude at 3 m\/s and the descent back onto it at 2 m\/s/);
    expect(() => planBatteries([], { ...opts, climbMps: 0, descentMps: 2 })).toThrow(/climbMps must be positive, got 0/);
  });

  it('flies each pack home at its last line\'s return altitude, climbing over the line\'s end first where the ground on the way needs it', () => {
    const vert = { ...opts, climbMps: 3, descentMps: 2 };
    // ends at 100 m above takeoff; the way home needs 118 m: 30 up + 30 out + 100 + (18 / 3 = 6 up) + 30 back + 118 / 2 = 59 down = 255 s
    const plan = planBatteries([{ ...line(1, 100), startAboveTakeoffM: 90, endAboveTakeoffM: 100, returnAboveTakeoffM: 118 }], vert);
    expect(plan.packs[0].flightTimeS).toBeCloseTo(255, 9);
    expect([plan.packs[0].homeAboveTakeoffM, plan.packs[0].homeClimbM]).toEqual([118, 18]);
    // a return altitude at or below the end's own changes nothing: home at the end's altitude, no climb
    const clear = planBatteries([{ ...line(1, 100), startAboveTakeoffM: 90, endAboveTakeoffM: 100, returnAboveTakeoffM: 100 }], vert);
    expect(clear.packs[0].flightTimeS).toBeCloseTo(30 + 30 + 100 + 30 + 50, 9);
    expect([clear.packs[0].homeAboveTakeoffM, clear.packs[0].homeClimbM]).toEqual([100, 0]);
    // without altitudes (a sheet stored before) no home figure at all
    expect(planBatteries([line(1, 100)], opts).packs[0].homeAboveTakeoffM).toBeUndefined();
  });

  it('says its figures assume still air', () => {
    expect(planBatteries([line(1, 10)], opts).notes.at(-1)).toMatch(/still air/);
  });

  it('throws on bad options, saying what it got', () => {
    expect(() => planBatteries([], { ...opts, reserve: 1 })).toThrow(/reserve must be in \[0, 1\), got 1/);
    expect(() => planBatteries([], { ...opts, speedMps: 0 })).toThrow(/speedMps must be positive/);
  });

  it('does not mutate its input', () => {
    const lines = [line(1, 100), line(2, 100)];
    const copy = structuredClone(lines);
    planBatteries(lines, opts);
    expect(lines).toEqual(copy);
  });
});
