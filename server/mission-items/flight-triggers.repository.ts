/** Photos as flown (flight_trigger rows): stored once per sortie and image, read back in capture order. */
import { and, asc, count, eq } from 'drizzle-orm';
import type { FlightTrigger } from '../../contracts/flight-triggers';
import type { Db } from '../../db/client';
import { flightTrigger } from '../../db/schema';

/** Factory over `{ db }`. */
export function createFlightTriggersRepository({ db }: { db: Db }) {
  return {
    /** Store a batch; a photo already stored for the sortie is skipped. Returns how many were new and the sortie's total. */
    async record(q: { teamId: string; versionId: string; sortie: string; userId: string; triggers: FlightTrigger[] }): Promise<{ stored: number; sortieTotal: number }> {
      const rows = q.triggers.map((t) => ({ ...t, capturedAt: new Date(t.capturedAt), teamId: q.teamId, planVersionId: q.versionId, sortie: q.sortie, recordedBy: q.userId }));
      const inserted = await db.insert(flightTrigger).values(rows).onConflictDoNothing().returning({ id: flightTrigger.id });
      const [total] = await db.select({ n: count() }).from(flightTrigger).where(and(eq(flightTrigger.planVersionId, q.versionId), eq(flightTrigger.sortie, q.sortie)));
      return { stored: inserted.length, sortieTotal: Number(total.n) };
    },

    async list(teamId: string, versionId: string) {
      const rows = await db
        .select()
        .from(flightTrigger)
        .where(and(eq(flightTrigger.teamId, teamId), eq(flightTrigger.planVersionId, versionId)))
        .orderBy(asc(flightTrigger.capturedAt), asc(flightTrigger.imageIndex));
      return rows.map((r) => ({
        sortie: r.sortie,
        imageIndex: r.imageIndex,
        lat: r.lat,
        lon: r.lon,
        altitudeAboveTakeoffM: r.altitudeAboveTakeoffM,
        altitudeMslM: r.altitudeMslM,
        rollDeg: r.rollDeg,
        pitchDeg: r.pitchDeg,
        yawDeg: r.yawDeg,
        capturedAt: r.capturedAt.toISOString(),
      }));
    },
  };
}
