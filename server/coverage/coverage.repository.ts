/** The coverage run a version keeps (the `coverage` column of plan_version), with what its routes need to answer. */
import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plan, planVersion } from '../../db/schema';

export function createCoverageRepository(deps: { db: Db }) {
  const { db } = deps;
  return {
    /** The version of the plan in the team, or null. */
    async find(teamId: string, planId: string, versionId: string) {
      const [row] = await db
        .select({ id: planVersion.id, number: planVersion.number, analysisState: planVersion.analysisState, coverage: planVersion.coverage, planName: plan.name })
        .from(planVersion)
        .innerJoin(plan, eq(plan.id, planVersion.planId))
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.planId, planId), eq(planVersion.id, versionId)))
        .limit(1);
      return row ?? null;
    },
  };
}
