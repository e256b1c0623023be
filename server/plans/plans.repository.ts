/** Plan and plan-version queries, always scoped to the team. */
import { and, asc, desc, eq, getTableColumns, inArray, sql } from 'drizzle-orm';
import type { MissionValues } from '../../contracts/mission';
import type { Plan, PlanVersion, VersionStatus, VersionSummary } from '../../contracts/plans';
import { analysisStateSchema } from '../../contracts/plans';
import { reviewStateSchema } from '../../contracts/reviews';
import type { Db } from '../../db/client';
import { plan, planVersion, user } from '../../db/schema';
import type { PlanResultData } from '../../contracts/plan-result';

type PlanRow = typeof plan.$inferSelect;

const statusCols = {
  id: planVersion.id,
  planId: planVersion.planId,
  number: planVersion.number,
  analysisState: planVersion.analysisState,
  analysisProgress: planVersion.analysisProgress,
  analysisError: planVersion.analysisError,
  analysedAt: planVersion.analysedAt,
};
const summaryCols = {
  ...statusCols,
  siteId: planVersion.siteId,
  reviewState: planVersion.reviewState,
  createdAt: planVersion.createdAt,
  createdById: planVersion.createdBy,
  createdByName: user.name,
};

interface StatusRow {
  id: string;
  planId: string;
  number: number;
  analysisState: string;
  analysisProgress: number;
  analysisError: string | null;
  analysedAt: Date | null;
}

function toStatus(r: StatusRow): VersionStatus {
  return {
    id: r.id,
    planId: r.planId,
    number: r.number,
    analysisState: analysisStateSchema.parse(r.analysisState),
    analysisProgressPct: r.analysisProgress,
    analysisError: r.analysisError,
    analysedAt: r.analysedAt?.toISOString() ?? null,
  };
}

function toSummary(r: StatusRow & { siteId: string; reviewState: string; createdAt: Date; createdById: string | null; createdByName: string | null }): VersionSummary {
  return {
    ...toStatus(r),
    siteId: r.siteId,
    reviewState: reviewStateSchema.parse(r.reviewState),
    createdAt: r.createdAt.toISOString(),
    createdBy: r.createdById ? { id: r.createdById, name: r.createdByName ?? '' } : null,
  };
}

export function createPlansRepository({ db }: { db: Db }) {
  // Prepared once (planned once per connection): every read of a version makes it, also when the body is cached.
  const summaryQuery = db
    .select(summaryCols)
    .from(planVersion)
    .leftJoin(user, eq(user.id, planVersion.createdBy))
    .where(and(eq(planVersion.teamId, sql.placeholder('teamId')), eq(planVersion.planId, sql.placeholder('planId')), eq(planVersion.id, sql.placeholder('versionId'))))
    .limit(1)
    .prepare('plan_version_summary');

  /** The latest version summary and the version count of each plan. */
  async function versionFacts(planIds: string[]) {
    const out = new Map<string, { count: number; latest: VersionSummary | null }>();
    if (planIds.length === 0) return out;
    const counts = await db
      .select({ planId: planVersion.planId, n: sql<number>`count(*)::int` })
      .from(planVersion)
      .where(inArray(planVersion.planId, planIds))
      .groupBy(planVersion.planId);
    const latest = await db
      .selectDistinctOn([planVersion.planId], summaryCols)
      .from(planVersion)
      .leftJoin(user, eq(user.id, planVersion.createdBy))
      .where(inArray(planVersion.planId, planIds))
      .orderBy(planVersion.planId, desc(planVersion.number));
    for (const id of planIds) out.set(id, { count: 0, latest: null });
    for (const c of counts) out.get(c.planId)!.count = Number(c.n);
    for (const l of latest) out.get(l.planId)!.latest = toSummary(l);
    return out;
  }

  function toPlan(row: PlanRow, facts: { count: number; latest: VersionSummary | null } | undefined): Plan {
    return {
      id: row.id,
      teamId: row.teamId,
      projectId: row.projectId,
      siteId: row.siteId,
      name: row.name,
      input: row.input as MissionValues,
      createdAt: row.createdAt.toISOString(),
      updatedAt: row.updatedAt.toISOString(),
      versionCount: facts?.count ?? 0,
      latestVersion: facts?.latest ?? null,
    };
  }

  async function get(teamId: string, planId: string): Promise<Plan | null> {
    const [row] = await db.select().from(plan).where(and(eq(plan.teamId, teamId), eq(plan.id, planId))).limit(1);
    if (!row) return null;
    return toPlan(row, (await versionFacts([row.id])).get(row.id));
  }

  return {
    get,

    async list(teamId: string, projectId: string): Promise<Plan[]> {
      const rows = await db
        .select(getTableColumns(plan))
        .from(plan)
        .where(and(eq(plan.teamId, teamId), eq(plan.projectId, projectId)))
        .orderBy(desc(plan.updatedAt), asc(plan.id));
      const facts = await versionFacts(rows.map((r) => r.id));
      return rows.map((r) => toPlan(r, facts.get(r.id)));
    },

    async insert(p: { teamId: string; projectId: string; siteId: string; name: string; input: MissionValues; createdBy: string }): Promise<Plan> {
      const [row] = await db.insert(plan).values(p).returning();
      return toPlan(row, undefined);
    },

    async update(teamId: string, planId: string, change: { name?: string; siteId?: string; input?: MissionValues }): Promise<Plan | null> {
      const rows = await db
        .update(plan)
        .set({ ...change, updatedAt: new Date() })
        .where(and(eq(plan.teamId, teamId), eq(plan.id, planId)))
        .returning({ id: plan.id });
      return rows.length ? get(teamId, planId) : null;
    },

    async remove(teamId: string, planId: string): Promise<boolean> {
      const rows = await db.delete(plan).where(and(eq(plan.teamId, teamId), eq(plan.id, planId))).returning({ id: plan.id });
      return rows.length > 0;
    },

    /** Versions under review or signed off (a plan with these keeps its history: it cannot be deleted). */
    async reviewedVersionCount(teamId: string, planId: string): Promise<number> {
      const [r] = await db
        .select({ n: sql<number>`count(*)::int` })
        .from(planVersion)
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId), inArray(planVersion.reviewState, ['in_review', 'signed_off'])));
      return Number(r.n);
    },

    async versions(teamId: string, planId: string): Promise<VersionSummary[]> {
      const rows = await db
        .select(summaryCols)
        .from(planVersion)
        .leftJoin(user, eq(user.id, planVersion.createdBy))
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId)))
        .orderBy(desc(planVersion.number));
      return rows.map(toSummary);
    },

    /** One version's summary (no input, no result): a light read that says whether the full version changed. */
    async versionSummary(teamId: string, planId: string, versionId: string): Promise<VersionSummary | null> {
      const [r] = await summaryQuery.execute({ teamId, planId, versionId });
      return r ? toSummary(r) : null;
    },

    async version(teamId: string, planId: string, versionId: string): Promise<PlanVersion | null> {
      const [r] = await db
        .select({ ...summaryCols, input: planVersion.input, result: planVersion.result })
        .from(planVersion)
        .leftJoin(user, eq(user.id, planVersion.createdBy))
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId), eq(planVersion.id, versionId)))
        .limit(1);
      if (!r) return null;
      return { ...toSummary(r), input: r.input as MissionValues, result: (r.result as PlanResultData | null) ?? null };
    },

    /** One line of a version's stored result, by its index in flying order (the database picks it out of the result). */
    async versionLine(teamId: string, planId: string, versionId: string, lineIndex: number): Promise<PlanResultData['lines'][number] | null> {
      const [r] = await db
        .select({ line: sql<unknown>`${planVersion.result} -> 'lines' -> ${lineIndex}::int` })
        .from(planVersion)
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId), eq(planVersion.id, versionId)))
        .limit(1);
      return (r?.line as PlanResultData['lines'][number] | null | undefined) ?? null;
    },

    async status(teamId: string, planId: string, versionId: string): Promise<VersionStatus | null> {
      const [r] = await db
        .select(statusCols)
        .from(planVersion)
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId), eq(planVersion.id, versionId)))
        .limit(1);
      return r ? toStatus(r) : null;
    },
  };
}

export type PlansRepository = ReturnType<typeof createPlansRepository>;
