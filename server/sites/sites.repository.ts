/** Site queries, always scoped to the team (and project where the route names one). */
import { and, asc, eq, getTableColumns, sql } from 'drizzle-orm';
import type { DemFileInfo, HillshadeInfo, Site, SiteUpdate, SurfaceKind } from '../../contracts/sites';
import { surfaceKindSchema } from '../../contracts/sites';
import type { Db } from '../../db/client';
import { plan, planVersion, site } from '../../db/schema';
import type { GridMetadata } from '../../terrain/index';

type SiteRow = typeof site.$inferSelect;

/** What the metadata column holds: the engine's GridMetadata plus what the file header said. */
export type StoredSiteMetadata = GridMetadata & { file: DemFileInfo };

// Written out with table names: inside a subquery drizzle leaves columns unqualified, and "id" would bind to the inner table.
const planCount = sql<number>`(select count(*)::int from plan p where p.site_id = "site"."id")`;

/** The API shape of a site row. */
export function toSite(row: SiteRow & { planCount: number }): Site {
  const { file, ...metadata } = row.metadata as StoredSiteMetadata;
  return {
    id: row.id,
    teamId: row.teamId,
    projectId: row.projectId,
    name: row.name,
    fileName: row.fileName,
    sizeBytes: row.sizeBytes,
    sha256: row.sha256,
    surfaceKind: surfaceKindSchema.parse(row.surfaceKind),
    verticalDatum: row.verticalDatum,
    metadata,
    file,
    hillshade: row.hillshade as HillshadeInfo,
    hillshadeUrl: `/api/teams/${row.teamId}/projects/${row.projectId}/sites/${row.id}/hillshade.png`,
    planCount: Number(row.planCount),
    createdAt: row.createdAt.toISOString(),
  };
}

interface NewSite {
  id: string;
  teamId: string;
  projectId: string;
  name: string;
  fileName: string;
  storageKey: string;
  sizeBytes: number;
  sha256: string;
  surfaceKind: SurfaceKind;
  verticalDatum: string;
  metadata: StoredSiteMetadata;
  hillshadeKey: string;
  hillshade: HillshadeInfo;
  createdBy: string;
}

export function createSitesRepository({ db }: { db: Db }) {
  const cols = { ...getTableColumns(site), planCount };

  return {
    async list(teamId: string, projectId: string) {
      return db
        .select(cols)
        .from(site)
        .where(and(eq(site.teamId, teamId), eq(site.projectId, projectId)))
        .orderBy(asc(site.createdAt), asc(site.id));
    },

    /** One site of the team; `projectId` narrows it to a project when the route names one. */
    async get(teamId: string, siteId: string, projectId?: string) {
      const where = [eq(site.teamId, teamId), eq(site.id, siteId)];
      if (projectId) where.push(eq(site.projectId, projectId));
      const [row] = await db.select(cols).from(site).where(and(...where)).limit(1);
      return row ?? null;
    },

    async findBySha(teamId: string, projectId: string, sha256: string) {
      const [row] = await db
        .select({ id: site.id })
        .from(site)
        .where(and(eq(site.teamId, teamId), eq(site.projectId, projectId), eq(site.sha256, sha256)))
        .limit(1);
      return row ?? null;
    },

    /** Insert; returns null when the project already has a site with this checksum (a concurrent duplicate). */
    async insert(s: NewSite) {
      const rows = await db.insert(site).values(s).onConflictDoNothing({ target: [site.projectId, site.sha256] }).returning({ id: site.id });
      return rows.length ? this.get(s.teamId, s.id) : null;
    },

    async update(teamId: string, siteId: string, change: SiteUpdate) {
      await db.update(site).set(change).where(and(eq(site.teamId, teamId), eq(site.id, siteId)));
      return this.get(teamId, siteId);
    },

    /** How many plans and plan versions use the site (either blocks deletion). */
    async usage(teamId: string, siteId: string) {
      const [p] = await db.select({ n: sql<number>`count(*)::int` }).from(plan).where(and(eq(plan.teamId, teamId), eq(plan.siteId, siteId)));
      const [v] = await db.select({ n: sql<number>`count(*)::int` }).from(planVersion).where(and(eq(planVersion.teamId, teamId), eq(planVersion.siteId, siteId)));
      return { plans: Number(p.n), versions: Number(v.n) };
    },

    async remove(teamId: string, siteId: string) {
      const rows = await db.delete(site).where(and(eq(site.teamId, teamId), eq(site.id, siteId))).returning({ storageKey: site.storageKey, hillshadeKey: site.hillshadeKey });
      return rows[0] ?? null;
    },
  };
}

export type SitesRepository = ReturnType<typeof createSitesRepository>;
