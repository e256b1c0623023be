/** Project queries; every one is scoped to a team, so ids of another team's projects find nothing. */
import { and, asc, desc, eq, getTableColumns, ilike, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import type { CreateProject, Project, ProjectListQuery, UpdateProject } from '../../contracts/projects';
import { projectListQuerySchema, unitSystemSchema } from '../../contracts/projects';
import type { Db } from '../../db/client';
import { project } from '../../db/schema';

type ProjectRow = typeof project.$inferSelect;

// Written out with table names: inside a subquery drizzle leaves columns unqualified, and "id" would bind to the inner table.
const counts = {
  siteCount: sql<number>`(select count(*)::int from site s where s.project_id = "project"."id")`,
  planCount: sql<number>`(select count(*)::int from plan p where p.project_id = "project"."id")`,
};

function toProject(row: ProjectRow & { siteCount: number; planCount: number }): Project {
  return {
    id: row.id,
    teamId: row.teamId,
    name: row.name,
    client: row.client,
    notes: row.notes,
    units: unitSystemSchema.parse(row.units),
    archivedAt: row.archivedAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    siteCount: Number(row.siteCount),
    planCount: Number(row.planCount),
  };
}

/** Escape LIKE wildcards so a search for "50%" means the text "50%". */
function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

export function createProjectsRepository({ db }: { db: Db }) {
  async function get(teamId: string, projectId: string): Promise<Project | null> {
    const [row] = await db
      .select({ ...getTableColumns(project), ...counts })
      .from(project)
      .where(and(eq(project.teamId, teamId), eq(project.id, projectId)))
      .limit(1);
    return row ? toProject(row) : null;
  }

  /**
   * The list read, prepared once per shape (archive filter, search or not, sort, order; at most 36): it is every
   * role's first read, and a prepared statement is planned once per connection instead of on every request.
   */
  const listQueries = new Map<string, ReturnType<typeof prepareList>>();
  function prepareList(archived: string, search: boolean, sort: string, order: 'asc' | 'desc') {
    const where: SQL[] = [eq(project.teamId, sql.placeholder('teamId'))];
    if (archived === 'active') where.push(isNull(project.archivedAt));
    if (archived === 'archived') where.push(isNotNull(project.archivedAt));
    if (search) {
      const p = sql.placeholder('pattern');
      where.push(or(ilike(project.name, p), ilike(project.client, p), ilike(project.notes, p))!);
    }
    const col = sort === 'name' ? sql`lower(${project.name})` : sort === 'created' ? project.createdAt : project.updatedAt;
    const dir = order === 'asc' ? asc : desc;
    return db
      .select({ ...getTableColumns(project), ...counts })
      .from(project)
      .where(and(...where))
      .orderBy(dir(col), asc(project.id))
      .prepare(`project_list_${archived}_${search ? 'search' : 'all'}_${sort}_${order}`);
  }
  function listQuery(archived: string, search: boolean, sort: string, order: 'asc' | 'desc') {
    const key = `${archived}:${search}:${sort}:${order}`;
    let q = listQueries.get(key);
    if (!q) listQueries.set(key, (q = prepareList(archived, search, sort, order)));
    return q;
  }

  return {
    get,

    /** Projects of a team filtered by search text (name, client, notes) and archive state, sorted. */
    async list(teamId: string, query: ProjectListQuery): Promise<Project[]> {
      const q = projectListQuerySchema.parse(query);
      // names read best A-Z; dates newest first, unless the caller says otherwise
      const order = q.order ?? (q.sort === 'name' ? 'asc' : 'desc');
      const rows = await listQuery(q.archived, Boolean(q.q), q.sort, order).execute({ teamId, pattern: q.q ? likePattern(q.q) : null });
      return rows.map(toProject);
    },

    async create(teamId: string, userId: string, input: CreateProject): Promise<Project> {
      const [row] = await db
        .insert(project)
        .values({ teamId, name: input.name, client: input.client ?? '', notes: input.notes ?? '', units: input.units ?? 'metric', createdBy: userId })
        .returning({ id: project.id });
      return (await get(teamId, row.id))!;
    },

    /** Apply an edit; returns null when the project is not in the team. */
    async update(teamId: string, projectId: string, change: UpdateProject): Promise<Project | null> {
      const { archived, ...fields } = change;
      const set: Partial<typeof project.$inferInsert> = { ...fields, updatedAt: new Date() };
      if (archived === true) set.archivedAt = sql`coalesce(${project.archivedAt}, now())` as unknown as Date;
      if (archived === false) set.archivedAt = null;
      const rows = await db
        .update(project)
        .set(set)
        .where(and(eq(project.teamId, teamId), eq(project.id, projectId)))
        .returning({ id: project.id });
      return rows.length ? get(teamId, projectId) : null;
    },

    /** Mark the project as changed (a site or plan inside it changed), for the "updated" sort. */
    async touch(teamId: string, projectId: string): Promise<void> {
      await db.update(project).set({ updatedAt: new Date() }).where(and(eq(project.teamId, teamId), eq(project.id, projectId)));
    },
  };
}

export type ProjectsRepository = ReturnType<typeof createProjectsRepository>;
