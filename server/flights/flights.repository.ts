/** The team's signed-off versions for the flights list, with their counts read inside PostgreSQL (results can be large). */
import { alias } from 'drizzle-orm/pg-core';
import { and, desc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { plan, planVersion, project, user } from '../../db/schema';

const signer = alias(user, 'signer');

export function createFlightsRepository({ db }: { db: Db }) {
  return {
    /** Signed-off versions only, newest sign-off first: the one list a pilot may see. */
    async signedOff(teamId: string) {
      return db
        .select({
          versionId: planVersion.id,
          planId: planVersion.planId,
          number: planVersion.number,
          planName: plan.name,
          projectName: project.name,
          client: project.client,
          signedOffBy: signer.name,
          signedOffAt: planVersion.signedOffAt,
          lineCount: sql<number>`coalesce(jsonb_array_length(${planVersion.result}->'lines'), 0)`.mapWith(Number),
          photoCount: sql<number>`coalesce((${planVersion.result}->'summary'->>'photoCount')::int, (select count(*) from jsonb_array_elements(${planVersion.result}->'lines') l, jsonb_array_elements(l->'stations')))`.mapWith(Number),
          flightTimeS: sql<number | null>`(${planVersion.result}->'summary'->>'flightTimeS')::float8`,
        })
        .from(planVersion)
        .innerJoin(plan, eq(plan.id, planVersion.planId))
        .innerJoin(project, eq(project.id, plan.projectId))
        .leftJoin(signer, eq(signer.id, planVersion.signedOffBy))
        .where(and(eq(planVersion.teamId, teamId), eq(planVersion.reviewState, 'signed_off')))
        .orderBy(desc(planVersion.signedOffAt));
    },
  };
}
