/** A small valid leg sheet (invented plan, fictional names) for the leg-sheet unit tests. */
import { legSheetSchema, type LegSheet, type SheetLeg } from '../../contracts/flights';

function leg(number: number, over: Partial<SheetLeg> = {}): SheetLeg {
  return {
    number,
    start: { lon: -2.5, lat: 54.3, distanceM: 0 },
    end: { lon: -2.49, lat: 54.3, distanceM: 650 },
    altitudeAboveTakeoffM: { start: 62.2, end: 62.2 },
    altitudeAboveDatumM: { start: 312.44, end: 312.44 },
    aglM: { min: 58.1, max: 66.4 },
    gsdCm: { min: 2.86, max: 3.12 },
    headingDeg: 90.4,
    lengthM: 650,
    timeS: 65,
    gradientPct: 0,
    kind: 'level',
    ...over,
  };
}

export function sampleSheet(versionId = 'v-1'): LegSheet {
  return legSheetSchema.parse({
    version: {
      id: versionId,
      planId: 'p-1',
      number: 2,
      planName: 'North bench',
      projectName: 'Hollin Fell quarry survey',
      client: 'Tarnside Aggregates (fictional)',
      reviewState: 'signed_off',
      signedOff: true,
      signedOffBy: 'Maren Toft',
      signedOffAt: '2026-12-01T10:00:00.000Z',
    },
    units: 'metric',
    datum: { name: 'EGM96 geoid', takeoff: { lon: -2.5, lat: 54.29 }, takeoffGroundM: 250.2 },
    speedMps: 10,
    altitudeMode: 'hold',
    lines: [
      { number: 1, headingDeg: 90, lengthM: 650, timeS: 65, photoCount: 30, start: { lon: -2.5, lat: 54.3 }, end: { lon: -2.49, lat: 54.3 }, legs: [leg(1)], warnings: [] },
    ],
    batteries: { enduranceMin: 25, reserve: 0.25, usablePerBatteryS: 1125, count: 1, packs: [{ number: 1, lines: [1], flightTimeS: 200, overBudget: false }], notes: [] },
    checklist: [{ id: 'wind', kind: 'check', text: 'Check the wind.' }],
    cautions: ['Bare-earth grids miss trees and masts.'],
    warnings: [],
    generatedAt: '2026-12-01T11:00:00.000Z',
  });
}
