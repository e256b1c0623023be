/** The versions waiting in a team's work lists, each with who moved it to its state, when, and the return comment. */
import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { WorkItem, WorkKind } from '../../contracts/work';
import { analysisStateSchema } from '../../contracts/plans';
import { reviewStateSchema } from '../../contracts/reviews';
import type { Db } from '../../db/client';
import { plan, planVersion, project, user } from '../../db/schema';
import { plainText } from '../../contracts/text';

/** The plan's newest version: returned and draft versions wait only while nothing newer replaced them. */
const isLatestOfPlan = sql`${planVersion.number} = (select max(v2.number) from plan_version v2 where v2.plan_id = ${planVersion.planId})`;

/** Which versions each list holds. */
const whereKind: Record<WorkKind, SQL> = {
  review: eq(planVersion.reviewState, 'in_review'),
  returned: and(eq(planVersion.reviewState, 'returned'), isLatestOfPlan)!,
  send: and(eq(planVersion.reviewState, 'draft'), eq(planVersion.analysisState, 'done'), isLatestOfPlan)!,
  flight: eq(planVersion.reviewState, 'signed_off'),
};

/** The newest audit entry that brought the version into its present review state (sent, returned, signed off). */
const lastEntry = (column: 'actor_id' | 'comment' | 'created_at') =>
  sql.raw(
    `(select a.${column} from audit_event a where a.plan_version_id = plan_version.id and a.to_state = plan_version.review_state order by a.created_at desc limit 1)`,
  );

export function createWorkRepository({ db }: { db: Db }) {
  return {
    /** The team's versions of `kind`, the longest-waiting first for reviews, otherwise the newest first. */
    async list(teamId: string, kind: WorkKind): Promise<WorkItem[]> {
      const since = sql<Date | string>`coalesce(${lastEntry('created_at')}, ${planVersion.signedOffAt}, ${planVersion.analysedAt}, ${planVersion.createdAt})`;
      const rows = await db
        .select({
          versionId: planVersion.id,
          planId: planVersion.planId,
          projectId: plan.projectId,
          number: planVersion.number,
          planName: plan.name,
          projectName: project.name,
          client: project.client,
          reviewState: planVersion.reviewState,
          analysisState: planVersion.analysisState,
          since,
          by: sql<string | null>`coalesce((select u.name from "user" u where u.id = ${lastEntry('actor_id')}), ${user.name})`,
          comment: sql<string | null>`${lastEntry('comment')}`,
        })
        .from(planVersion)
        .innerJoin(plan, eq(plan.id, planVersion.planId))
        .innerJoin(project, eq(project.id, plan.projectId))
        .leftJoin(user, eq(user.id, kind === 'flight' ? planVersion.signedOffBy : planVersion.createdBy))
        .where(and(eq(planVersion.teamId, teamId), openProjectsOnly(kind), whereKind[kind]))
        .orderBy(kind === 'review' ? since : desc(since));
      return rows.map((r) => ({
        ...r,
        reviewState: reviewStateSchema.parse(r.reviewState),
        analysisState: analysisStateSchema.parse(r.analysisState),
        planName: plainText(r.planName),
        projectName: plainText(r.projectName),
        client: plainText(r.client),
        by: r.by === null ? null : plainText(r.by),
        comment: kind === 'returned' && r.comment ? r.comment : null,
        since: new Date(r.since).toISOString(),
      }));
    },
  };
}

/** Archived projects drop out of the planning lists; a signed-off flight stays listed for the pilot. */
function openProjectsOnly(kind: WorkKind): SQL | undefined {
  return kind === 'flight' ? undefined : sql`${project.archivedAt} is null`;
}
