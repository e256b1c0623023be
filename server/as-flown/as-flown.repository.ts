/** As-flown checks (as_flown_check rows), each written with its audit entry in one transaction; never changed after. */
import { and, count, desc, eq, sql } from 'drizzle-orm';
import type { AsFlownCheck, AsFlownCheckSummary, AsFlownDoc, NewAsFlownCheck } from '../../contracts/as-flown';
import type { Db } from '../../db/client';
import { asFlownCheck, auditEvent, user } from '../../db/schema';
import { isUuid } from '../http/ids';

// The headline figures are read out of the stored document by PostgreSQL: a list never loads whole documents.
const summaryColumns = {
  id: asFlownCheck.id,
  versionId: asFlownCheck.planVersionId,
  source: asFlownCheck.source,
  label: asFlownCheck.label,
  photoCount: asFlownCheck.photoCount,
  createdAt: asFlownCheck.createdAt,
  createdById: asFlownCheck.createdBy,
  createdByName: user.name,
  shareAllFlown: sql<number>`(${asFlownCheck.document}->'flown'->>'shareAll')::float8`,
  shareAllPlanned: sql<number>`(${asFlownCheck.document}->'planned'->>'shareAll')::float8`,
  missedTriggers: sql<number>`jsonb_array_length(${asFlownCheck.document}->'matching'->'missed')`,
  lostAreaM2: sql<number>`(${asFlownCheck.document}->'difference'->>'lostAreaM2')::float8`,
};

type Row = { [K in keyof typeof summaryColumns]: unknown };

function summaryOf(r: Row): AsFlownCheckSummary {
  return {
    id: r.id as string,
    versionId: r.versionId as string,
    source: r.source as AsFlownCheckSummary['source'],
    label: r.label as string,
    photoCount: r.photoCount as number,
    createdAt: (r.createdAt as Date).toISOString(),
    createdBy: r.createdById ? { id: r.createdById as string, name: (r.createdByName as string | null) ?? 'A former member' } : null,
    shareAllFlown: Number(r.shareAllFlown),
    shareAllPlanned: Number(r.shareAllPlanned),
    missedTriggers: Number(r.missedTriggers),
    lostAreaM2: Number(r.lostAreaM2),
  };
}

/** Factory over `{ db }`. */
export function createAsFlownRepository({ db }: { db: Db }) {
  function select() {
    return db.select(summaryColumns).from(asFlownCheck).leftJoin(user, eq(user.id, asFlownCheck.createdBy));
  }

  function selectWhole() {
    return db.select({ ...summaryColumns, document: asFlownCheck.document }).from(asFlownCheck).leftJoin(user, eq(user.id, asFlownCheck.createdBy));
  }

  return {
    /** Store a check and its audit entry ("N photos from <label>"): both or neither. */
    async insert(q: { teamId: string; planId: string; versionId: string; userId: string; input: NewAsFlownCheck; document: AsFlownDoc }): Promise<string> {
      return db.transaction(async (tx) => {
        const [row] = await tx
          .insert(asFlownCheck)
          .values({ teamId: q.teamId, planVersionId: q.versionId, source: q.input.source, label: q.input.label, photoCount: q.input.photos.length, photos: q.input.photos, document: q.document, createdBy: q.userId })
          .returning({ id: asFlownCheck.id });
        const d = q.document;
        await tx.insert(auditEvent).values({
          teamId: q.teamId,
          planId: q.planId,
          planVersionId: q.versionId,
          actorId: q.userId,
          action: 'as-flown.checked',
          comment: `${q.input.photos.length} photos (${q.input.source === 'csv' ? 'CSV photo log' : 'read on the device'}: ${q.input.label}); whole spec met on ${(d.flown.shareAll * 100).toFixed(1)} % of the area as flown, ${(d.planned.shareAll * 100).toFixed(1)} % as planned; ${d.matching.missed.length} missed triggers`,
        });
        return row.id;
      });
    },

    /** The version's checks, newest first. */
    async list(teamId: string, versionId: string): Promise<AsFlownCheckSummary[]> {
      const rows = await select().where(and(eq(asFlownCheck.teamId, teamId), eq(asFlownCheck.planVersionId, versionId))).orderBy(desc(asFlownCheck.createdAt));
      return rows.map(summaryOf);
    },

    /** The newest check of the version and how many there are (for the report). */
    async latest(teamId: string, versionId: string): Promise<{ check: AsFlownCheck | null; count: number }> {
      const where = and(eq(asFlownCheck.teamId, teamId), eq(asFlownCheck.planVersionId, versionId));
      const [first] = await selectWhole().where(where).orderBy(desc(asFlownCheck.createdAt)).limit(1);
      const [n] = await db.select({ n: count() }).from(asFlownCheck).where(where);
      return { check: first ? { ...summaryOf(first), document: first.document as AsFlownDoc } : null, count: Number(n.n) };
    },

    async find(teamId: string, versionId: string, checkId: string): Promise<AsFlownCheck | null> {
      if (!isUuid(checkId)) return null;
      const [r] = await selectWhole().where(and(eq(asFlownCheck.teamId, teamId), eq(asFlownCheck.planVersionId, versionId), eq(asFlownCheck.id, checkId))).limit(1);
      return r ? { ...summaryOf(r), document: r.document as AsFlownDoc } : null;
    },
  };
}
