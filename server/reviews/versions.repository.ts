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
export function seesSignedOffOnly(role: Role): boolean {
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
  function base(where: SQL | undefined) {
    return db
      .select(selection())
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

  function conditions(q: { teamId: string; versionId: string; planId?: string; role: Role }): SQL | null {
    if (!isUuid(q.versionId) || (q.planId !== undefined && !isUuid(q.planId))) return null;
    const conds: SQL[] = [eq(planVersion.teamId, q.teamId), eq(planVersion.id, q.versionId)];
    if (q.planId !== undefined) conds.push(eq(planVersion.planId, q.planId));
    if (seesSignedOffOnly(q.role)) conds.push(eq(planVersion.reviewState, 'signed_off'));
    return and(...conds)!;
  }

  /**
   * The stamp read, prepared once per shape (with or without the plan id, signed-off only or not): every cached
   * leg sheet and report read makes it, and a prepared statement is planned once per connection instead of on
   * every request. The same conditions as `conditions`, with placeholders.
   */
  const stampQueries = new Map<string, ReturnType<typeof prepareStamp>>();
  function prepareStamp(withPlan: boolean, signedOffOnly: boolean) {
    const conds: SQL[] = [eq(planVersion.teamId, sql.placeholder('teamId')), eq(planVersion.id, sql.placeholder('versionId'))];
    if (withPlan) conds.push(eq(planVersion.planId, sql.placeholder('planId')));
    if (signedOffOnly) conds.push(eq(planVersion.reviewState, 'signed_off'));
    const { input: _i, result: _r, coverage: _c, siteMetadata: _m, ...light } = selection();
    return db
      .select(light)
      .from(planVersion)
      .innerJoin(plan, eq(plan.id, planVersion.planId))
      .innerJoin(project, eq(project.id, plan.projectId))
      .innerJoin(site, eq(site.id, planVersion.siteId))
      .leftJoin(creator, eq(creator.id, planVersion.createdBy))
      .leftJoin(signer, eq(signer.id, planVersion.signedOffBy))
      .leftJoin(flownConfirmation, eq(flownConfirmation.planVersionId, planVersion.id))
      .leftJoin(confirmer, eq(confirmer.id, flownConfirmation.confirmedBy))
      .where(and(...conds))
      .limit(1)
      .prepare(`version_stamp_${withPlan ? 'plan' : 'any'}_${signedOffOnly ? 'signed' : 'all'}`);
  }
  function stampQuery(withPlan: boolean, signedOffOnly: boolean) {
    const key = `${withPlan}:${signedOffOnly}`;
    let q = stampQueries.get(key);
    if (!q) stampQueries.set(key, (q = prepareStamp(withPlan, signedOffOnly)));
    return q;
  }

  return {
    /**
     * What a version's derived documents (leg sheet, report) depend on besides its immutable input and result, as
     * one string, or null when the caller may not see the version: a light read that keys cached documents.
     */
    async stamp(q: { teamId: string; versionId: string; planId?: string; role: Role }): Promise<string | null> {
      if (!isUuid(q.versionId) || (q.planId !== undefined && !isUuid(q.planId))) return null;
      const rows = await stampQuery(q.planId !== undefined, seesSignedOffOnly(q.role)).execute({ teamId: q.teamId, versionId: q.versionId, planId: q.planId ?? null });
      return rows[0] ? JSON.stringify(rows[0]) : null;
    },

    /**
     * One version of the team, or null. `planId` narrows it to one plan (URLs that name both must agree);
     * for a pilot, anything but a signed-off version is as good as absent.
     */
    async find(q: { teamId: string; versionId: string; planId?: string; role: Role }) {
      const where = conditions(q);
      if (!where) return null;
      const rows = await base(where).limit(1);
      return rows[0] ? cleaned(rows[0]) : null;
    },

    /** The team's signed-off versions, newest sign-off first. */
    async signedOff(teamId: string) {
      const rows = await base(and(eq(planVersion.teamId, teamId), eq(planVersion.reviewState, 'signed_off'))).orderBy(
        desc(planVersion.signedOffAt),
      );
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
