import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { legSheetSchema, type LegSheet } from '../../contracts/flights';
import { SOLVE_REPORT_KEYS } from '../../contracts/solve';
import { planResultSchema } from '../../contracts/plan-result';
import { analysedResult, createVersion, freshTeam, solvedMission, solvedResult, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { readMission } from '../../server/versions/result-view';

let srv: TestServer;
let team: FreshTeam;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'flights');
});
afterAll(async () => srv?.stop());

const sheetPath = (versionId: string) => `/api/teams/${team.teamId}/flights/${versionId}/leg-sheet`;

describe('the pilot sees signed-off versions only', () => {
  it('lists the team\'s signed-off versions and nothing else', async () => {
    const made = {} as Record<string, string>;
    for (const state of ['draft', 'in_review', 'returned', 'signed_off'] as const) {
      made[state] = (await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: state, planName: `Plan ${state}` })).versionId;
    }
    const other = await freshTeam(srv, 'flights-other');
    await createVersion(srv, { teamId: other.teamId, createdBy: other.users.planner.id, reviewState: 'signed_off' });
    const res = await team.clients.pilot.get(`/api/teams/${team.teamId}/flights`);
    expect(res.status).toBe(200);
    expect(res.body.flights.map((f: { versionId: string }) => f.versionId)).toEqual([made.signed_off]);
    const result = analysedResult();
    expect(res.body.flights[0]).toMatchObject({
      planName: 'Plan signed_off',
      lineCount: result.lines.length,
      photoCount: result.summary.photoCount,
      flightTimeS: result.summary.flightTimeS,
    });

    expect((await team.clients.pilot.get(sheetPath(made.signed_off))).status).toBe(200);
    for (const state of ['draft', 'in_review', 'returned'] as const) {
      const r = await team.clients.pilot.get(sheetPath(made[state]));
      expect(r.status, state).toBe(404); // as if it did not exist
    }
  });

  it('shows a planner an unsigned version, stamped as not for flight', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    const r = await team.clients.planner.get(sheetPath(v.versionId));
    expect(r.status).toBe(200);
    expect(r.body.version.signedOff).toBe(false);
    expect(r.body.cautions[0]).toMatch(/^NOT SIGNED OFF/);
  });

  it('answers 404 for another team\'s version', async () => {
    const other = await freshTeam(srv, 'flights-other2');
    const v = await createVersion(srv, { teamId: other.teamId, createdBy: other.users.planner.id, reviewState: 'signed_off' });
    expect((await team.clients.pilot.get(sheetPath(v.versionId))).status).toBe(404);
    expect((await team.clients.owner.get(sheetPath(v.versionId))).status).toBe(404);
  });
});

describe('the leg sheet', () => {
  it('gives lines in flying order with their legs, altitudes above takeoff and datum, heading, length and time', async () => {
    const result = analysedResult();
    const stored = { ...result, lines: [...result.lines].reverse() }; // stored out of order: the sheet sorts by index
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', result: stored });
    const res = await team.clients.pilot.get(sheetPath(v.versionId));
    expect(res.headers.get('cache-control')).toBe('private, max-age=300');
    const sheet: LegSheet = legSheetSchema.parse(res.body);
    expect(sheet.lines.map((l) => l.number)).toEqual(result.lines.map((_, i) => i + 1));
    expect(sheet.datum.name).toBe('EGM96 geoid');
    expect(sheet.speedMps).toBe(10);

    result.lines.forEach((line, i) => {
      const s = sheet.lines[i];
      expect(s.legs).toHaveLength(line.legs.length);
      line.legs.forEach((leg, g) => {
        const got = s.legs[g];
        expect(got.altitudeAboveTakeoffM).toEqual({ start: leg.altitudeStartAboveTakeoffM, end: leg.altitudeEndAboveTakeoffM });
        expect(got.altitudeAboveDatumM).toEqual({ start: leg.altitudeStartM, end: leg.altitudeEndM });
        expect(got.aglM).toEqual({ min: leg.aglMinM, max: leg.aglMaxM });
        const lengthM = Math.abs(leg.end.distanceM - leg.start.distanceM);
        expect(got.lengthM).toBeCloseTo(lengthM, 9);
        expect(got.timeS).toBeCloseTo(lengthM / 10, 9);
        // Geodesic azimuth of the leg (GeographicLib) against the engine's line heading, which is measured in the
        // local UTM-based frame: they differ by about the meridian convergence, gamma ~ dLon x sin(lat)
        // ~ 0.18 x sin(54.25) ~ 0.15 degrees here (relation from memory).
        const d = Math.abs(((got.headingDeg! - line.headingDeg + 540) % 360) - 180);
        expect(d).toBeLessThan(0.5);
      });
      expect(s.headingDeg).toBe(line.headingDeg);
      expect(s.lengthM).toBe(line.lengthM);
    });
    // Lines alternate direction (boustrophedon).
    expect(Math.abs(sheet.lines[0].headingDeg! - sheet.lines[1].headingDeg!)).toBeCloseTo(180, 6);
    // The takeoff point's ground as the engine sampled it; datum altitude minus altitude above takeoff agrees (to the rounding).
    expect(sheet.datum.takeoffGroundM).toBe(result.takeoff.groundM);
    const leg = result.lines[0].legs[0];
    expect(sheet.datum.takeoffGroundM!).toBeCloseTo(leg.altitudeStartM - leg.altitudeStartAboveTakeoffM, 1);
  });

  it('times a solved plan\'s legs at their own speeds, and packs batteries with the transits between lines', async () => {
    const result = solvedResult();
    const repeated = { code: 'short-leg', message: 'Line 1, leg 2 is 12 m long, shorter than the 50 m shortest-leg setting.' };
    result.lines[0].warnings.push(repeated);
    result.warnings.push(repeated);
    const input = solvedMission();
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', result, input });
    const sheet: LegSheet = legSheetSchema.parse((await team.clients.pilot.get(sheetPath(v.versionId))).body);
    let slow = 0;
    result.lines.forEach((line, i) => line.legs.forEach((leg, g) => {
      const lengthM = Math.abs(leg.end.distanceM - leg.start.distanceM);
      expect(leg.speedMps).toBeGreaterThan(0);
      if (leg.speedMps! < 10 - 1e-9) slow++;
      expect(sheet.lines[i].legs[g].timeS).toBeCloseTo(lengthM / leg.speedMps!, 6);
    }));
    // the fixture climbs at 0.2 m/s: some legs are slowed, and their time is the longer one
    expect(slow).toBeGreaterThan(0);
    // a line's warnings are on its card, not again in the sheet's list (the plan's own list repeats them, as the
    // engine writes it: planWideWarnings in terrain/plan.ts)
    expect(sheet.lines[0].warnings).toContain(repeated.message);
    expect(sheet.warnings).not.toContain(repeated.message);
    expect(sheet.warnings.length).toBeGreaterThan(0);
    // each pack: straight up off the takeoff to the first line's altitude above it and out, its lines, a turn and
    // the transit between each (level at 10 m/s plus the change of altitude at 0.2 m/s up or down), back, and
    // straight down onto the takeoff
    const mission = readMission(input);
    const speed = mission.speedMps, turn = mission.turnTimeS;
    expect([speed, mission.climbMps, mission.descentMps]).toEqual([10, 0.2, 0.2]);
    const hav = (a: { lon: number; lat: number }, b: { lon: number; lat: number }) => {
      // haversine on a 6,371,008.8 m sphere (IUGG mean Earth radius, from memory): within 0.5 % of the geodesic here
      const r = Math.PI / 180, dLat = (b.lat - a.lat) * r, dLon = (b.lon - a.lon) * r;
      const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * r) * Math.cos(b.lat * r) * Math.sin(dLon / 2) ** 2;
      return 2 * 6_371_008.8 * Math.asin(Math.sqrt(h));
    };
    const takeoff = mission.takeoff;
    for (const p of sheet.batteries.packs) {
      const ls = p.lines.map((n) => sheet.lines[n - 1]);
      let t = Math.abs(ls[0].legs[0].altitudeAboveTakeoffM.start) / 0.2 + hav(takeoff, ls[0].start) / speed + ls[0].timeS;
      for (let k = 1; k < ls.length; k++) {
        const a = ls[k - 1], b = ls[k];
        const dz = b.legs[0].altitudeAboveDatumM.start - a.legs.at(-1)!.altitudeAboveDatumM.end;
        t += turn + hav(a.end, b.start) / speed + Math.abs(dz) / 0.2 + b.timeS;
      }
      // home from the last line at the plan's return altitude for it (at least its end's): climb first, then down
      const endAlt = ls.at(-1)!.legs.at(-1)!.altitudeAboveTakeoffM.end;
      const home = Math.max(endAlt, result.lines[ls.at(-1)!.number - 1].returnAltitudeAboveTakeoffM!);
      expect(p.homeAboveTakeoffM).toBeCloseTo(home, 6);
      t += (home - endAlt) / 0.2 + hav(ls.at(-1)!.end, takeoff) / speed + Math.abs(home) / 0.2;
      expect(p.flightTimeS / t).toBeGreaterThan(0.995);
      expect(p.flightTimeS / t).toBeLessThan(1.005);
    }
  });

  it('marks the solver\'s spot photos and sets of lines, and cautions a tilted camera in the sheet, its checklist and the exports', async () => {
    // the stored result of a solved plan, its lines read as a slant plan's: two sets, the camera tilted 35° on the
    // lines of the layout and straight down on one spot photo between them (the solver's own choices say which)
    // stored as the analysis worker stores a solved plan: the solver's report under `solved`
    const plan = solvedResult() as unknown as Record<string, unknown>;
    const report = Object.fromEntries(SOLVE_REPORT_KEYS.map((k) => [k, plan[k]]));
    for (const k of SOLVE_REPORT_KEYS) delete plan[k];
    const result = planResultSchema.parse({ ...plan, solved: report });
    expect(result.lines.length).toBeGreaterThan(3);
    const n = result.lines.length;
    const spotAt = 1;
    result.solved!.choices.lines = result.solved!.choices.lines.map((c, i) => ({ ...c, kind: i === spotAt ? 'spot' : 'line', set: i < n / 2 ? 1 : 2 }));
    result.lines.forEach((l, i) => { if (i !== spotAt) l.cameraTiltDeg = 35; });
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', result, input: solvedMission() });
    const sheet: LegSheet = legSheetSchema.parse((await team.clients.pilot.get(sheetPath(v.versionId))).body);
    expect(sheet.lines.map((l) => l.kind)).toEqual(result.lines.map((_, i) => (i === spotAt ? 'spot' : 'line')));
    expect(sheet.lines.map((l) => l.set)).toEqual(result.lines.map((_, i) => (i === spotAt ? undefined : i < n / 2 ? 1 : 2)));
    expect(sheet.lines.map((l) => l.cameraTiltDeg)).toEqual(result.lines.map((_, i) => (i === spotAt ? undefined : 35)));
    const caution = sheet.cautions.find((c) => c.startsWith('The camera is tilted 35° from straight down towards the nose'));
    expect(caution).toBeDefined();
    expect(sheet.checklist.filter((c) => c.kind === 'caution').map((c) => c.text)).toContain(caution);
    const geo = (await team.clients.pilot.get(`${v.path}/export.geojson`)).body;
    expect(geo.cautions).toContain(caution);
    // one set and no spots: a plan laid out from the settings has neither, nor the caution
    const plain = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off' });
    const plainSheet: LegSheet = legSheetSchema.parse((await team.clients.pilot.get(sheetPath(plain.versionId))).body);
    expect(new Set(plainSheet.lines.map((l) => `${l.kind}/${l.set}`))).toEqual(new Set(['line/undefined']));
    expect(plainSheet.cautions.join(' ')).not.toContain('The camera is tilted');
  });

  it('plans the batteries and carries the pre-flight checklist with the cautions', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', surfaceKind: 'bare-earth' });
    const sheet: LegSheet = (await team.clients.pilot.get(sheetPath(v.versionId))).body;
    // 25 min endurance, 25 % reserve (the fixture's mission): 1125 s usable per battery.
    expect(sheet.batteries.usablePerBatteryS).toBe(1125);
    expect(sheet.batteries.packs.flatMap((p) => p.lines)).toEqual(sheet.lines.map((l) => l.number));
    expect(sheet.batteries.count).toBe(sheet.batteries.packs.length);
    for (const p of sheet.batteries.packs) expect(p.flightTimeS).toBeLessThanOrEqual(1125);
    const ids = sheet.checklist.map((c) => c.id);
    expect(ids).toEqual(expect.arrayContaining(['takeoff-height', 'limits', 'line-of-sight', 'wind', 'batteries']));
    const text = sheet.checklist.map((c) => c.text).join('\n');
    expect(text).toMatch(/bare earth: trees, masts/);
    expect(text).toMatch(/Local rules govern/);
    expect(text).toMatch(/line of sight/);
    expect(text).toMatch(/Wind/);
    expect(sheet.checklist.find((c) => c.id === 'takeoff-height')!.text).toContain(`${sheet.datum.takeoffGroundM!.toFixed(1)} m above EGM96 geoid`);
  });
});
