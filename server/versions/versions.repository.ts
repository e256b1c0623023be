/** Plan-version lookups shared by reviews, reports, leg sheets and exports, with the pilot's signed-off-only rule in the query. */
import { alias } from 'drizzle-orm/pg-core';
import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { Role } from '../../contracts/roles';
import type { Db } from '../../db/client';
import { flownConfirmation, plan, planVersion, project, site, user } from '../../db/schema';
import { plainText } from '../../contracts/text';
import { isUuid } from '../http/ids';

const creator = alias(user, 'creator');
const signer = alias(user, 'signer');
const confirmer = alias(user, 'confirmer');

/** Roles that may only ever see signed-off versions. */
function seesSignedOffOnly(role: Role): boolean {
  return role === 'pilot';
}

function selection() {
  return {
    id: planVersion.id,
    teamId: planVersion.teamId,
    planId: planVersion.planId,
    number: planVersion.number,
    input: planVersion.input,
    reviewState: planVersion.reviewState,
    analysisState: planVersion.analysisState,
    analysisError: planVersion.analysisError,
    result: planVersion.result,
    coverage: planVersion.coverage,
    analysedAt: planVersion.analysedAt,
    createdAt: planVersion.createdAt,
    createdById: planVersion.createdBy,
    createdByName: creator.name,
    createdByEmail: creator.email,
    signedOffById: planVersion.signedOffBy,
    signedOffByName: signer.name,
    signedOffAt: planVersion.signedOffAt,
    signOffReasons: planVersion.signOffReasons,
    flownConfirmedById: flownConfirmation.confirmedBy,
    flownConfirmedByName: confirmer.name,
    flownConfirmedAt: flownConfirmation.confirmedAt,
    flownCheckId: flownConfirmation.checkId,
    flownReasons: flownConfirmation.reasons,
    planName: plan.name,
    projectId: project.id,
    projectName: project.name,
    projectClient: project.client,
    projectUnits: project.units,
    siteId: site.id,
    siteName: site.name,
    siteFileName: site.fileName,
    siteSurfaceKind: site.surfaceKind,
    siteVerticalDatum: site.verticalDatum,
    siteMetadata: site.metadata,
  };
}


/** Names typed by people, cleaned once here for every report, leg sheet, export and mail built from a version. */
const textFields = ['planName', 'projectName', 'projectClient', 'siteName', 'siteFileName', 'siteVerticalDatum', 'createdByName', 'signedOffByName', 'flownConfirmedByName'] as const;

function cleaned<T extends Partial<Record<(typeof textFields)[number], string | null>>>(row: T): T {
  const out = { ...row };
  for (const k of textFields) {
    const v = out[k];
    if (typeof v === 'string') (out as Record<string, unknown>)[k] = plainText(v);
  }
  return out;
}

/** A version with its plan, project, site, creator and signer, as the lookups answer it. */
export type VersionRecord = NonNullable<Awaited<ReturnType<ReturnType<typeof createVersionsRepository>['find']>>>;

/** Factory over `{ db }`. */
export function createVersionsRepository({ db }: { db: Db }) {
  /**
   * The one lookup of a version with its plan, project, site, creator, signer and flown confirmation. It answers
   * two shapes from one join chain: the whole version (`full` true), or the light stamp row with the large JSON
   * columns (input, result, coverage, the site's metadata) left null, which every cached leg sheet and report read
   * makes. Drizzle cannot type a join chain over a generic selection, so the shape is a parameter of the query,
   * not of its type. `teamId`, `versionId`, `planId` and `full` are placeholders: each variant is prepared once
   * per connection instead of planned on every request.
   */
  const heavy = (column: typeof planVersion.input | typeof planVersion.result | typeof planVersion.coverage | typeof site.metadata) =>
    sql<unknown>`case when ${sql.placeholder('full')} then ${column} end`;
  function joined(where: SQL | undefined) {
    const fields = selection();
    return db
      .select({ ...fields, input: heavy(planVersion.input), result: heavy(planVersion.result), coverage: heavy(planVersion.coverage), siteMetadata: heavy(site.metadata) })
      .from(planVersion)
      .innerJoin(plan, eq(plan.id, planVersion.planId))
      .innerJoin(project, eq(project.id, plan.projectId))
      .innerJoin(site, eq(site.id, planVersion.siteId))
      .leftJoin(creator, eq(creator.id, planVersion.createdBy))
      .leftJoin(signer, eq(signer.id, planVersion.signedOffBy))
      .leftJoin(flownConfirmation, eq(flownConfirmation.planVersionId, planVersion.id))
      .leftJoin(confirmer, eq(confirmer.id, flownConfirmation.confirmedBy))
      .where(where);
  }

  /** One version, prepared once per shape of the conditions (with or without the plan id, signed-off only or not). */
  function prepareOne(withPlan: boolean, signedOffOnly: boolean) {
    const conds: SQL[] = [eq(planVersion.teamId, sql.placeholder('teamId')), eq(planVersion.id, sql.placeholder('versionId'))];
    if (withPlan) conds.push(eq(planVersion.planId, sql.placeholder('planId')));
    if (signedOffOnly) conds.push(eq(planVersion.reviewState, 'signed_off'));
    return joined(and(...conds))
      .limit(1)
      .prepare(`version_one_${withPlan ? 'plan' : 'any'}_${signedOffOnly ? 'signed' : 'all'}`);
  }
  const oneQueries = new Map<string, ReturnType<typeof prepareOne>>();
  /** The version `q` names as the caller may see it (a pilot: signed off only), in the whole or the stamp shape; null when unseen. */
  async function one(q: { teamId: string; versionId: string; planId?: string; role: Role }, full: boolean) {
    if (!isUuid(q.versionId) || (q.planId !== undefined && !isUuid(q.planId))) return null;
    const withPlan = q.planId !== undefined;
    const signedOffOnly = seesSignedOffOnly(q.role);
    const key = `${withPlan}:${signedOffOnly}`;
    let query = oneQueries.get(key);
    if (!query) oneQueries.set(key, (query = prepareOne(withPlan, signedOffOnly)));
    const rows = await query.execute({ teamId: q.teamId, versionId: q.versionId, planId: q.planId ?? null, full });
    return rows[0] ?? null;
  }
  const signedOffQuery = joined(and(eq(planVersion.teamId, sql.placeholder('teamId')), eq(planVersion.reviewState, 'signed_off')))
    .orderBy(desc(planVersion.signedOffAt))
    .prepare('versions_signed_off');

  return {
    /**
     * What a version's derived documents (leg sheet, report) depend on besides its immutable input and result, as
     * one string, or null when the caller may not see the version: a light read that keys cached documents.
     */
    async stamp(q: { teamId: string; versionId: string; planId?: string; role: Role }): Promise<string | null> {
      const row = await one(q, false);
      return row ? JSON.stringify(row) : null;
    },

    /**
     * One version of the team, or null. `planId` narrows it to one plan (URLs that name both must agree);
     * for a pilot, anything but a signed-off version is as good as absent.
     */
    async find(q: { teamId: string; versionId: string; planId?: string; role: Role }) {
      const row = await one(q, true);
      return row ? cleaned(row) : null;
    },

    /** The team's signed-off versions, newest sign-off first. */
    async signedOff(teamId: string) {
      const rows = await signedOffQuery.execute({ teamId, full: true });
      return rows.map(cleaned);
    },

    /** Whether the plan exists in the team (for routes that name a plan only). */
    async planExists(teamId: string, planId: string): Promise<boolean> {
      if (!isUuid(planId)) return false;
      const rows = await db
        .select({ id: plan.id })
        .from(plan)
        .where(and(eq(plan.teamId, teamId), eq(plan.id, planId)))
        .limit(1);
      return rows.length > 0;
    },
  };
}

export type VersionsRepository = ReturnType<typeof createVersionsRepository>;
