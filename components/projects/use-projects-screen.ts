/** State of the projects list: search text (debounced), sort, archived filter, and which project is being edited. */
import { useEffect, useMemo, useState } from 'react';
import type { ProjectListQuery } from '../../contracts/projects';
import { can } from '../../contracts/roles';
import { useCurrentTeam } from '../team/current-team-context';
import { useCreateProject, useProjects, useUpdateProject } from './projects.queries';

export type SortChoice = 'updated' | 'name' | 'created';
export type ArchivedChoice = 'active' | 'archived' | 'all';

/** Typing settles for this long before the list is asked again. */
const searchDelayMs = 250;

/** Names first A→Z; dates newest first. */
function orderFor(sort: SortChoice): 'asc' | 'desc' {
  return sort === 'name' ? 'asc' : 'desc';
}

export function useProjectsScreen() {
  const { team, role } = useCurrentTeam();
  const teamId = team?.id;
  const [search, setSearch] = useState('');
  const [settledSearch, setSettledSearch] = useState('');
  const [sort, setSort] = useState<SortChoice>('updated');
  const [archived, setArchived] = useState<ArchivedChoice>('active');
  const [creating, setCreating] = useState(false);
  const [editingId, setEditingId] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<string | null>(null);

  useEffect(() => {
    const t = setTimeout(() => setSettledSearch(search), searchDelayMs);
    return () => clearTimeout(t);
  }, [search]);

  const query = useMemo<ProjectListQuery>(() => ({ q: settledSearch || undefined, sort, order: orderFor(sort), archived }), [settledSearch, sort, archived]);
  const mayRead = can(role, 'project:read');
  const projects = useProjects(teamId, query, mayRead);
  const create = useCreateProject(teamId ?? '');
  const update = useUpdateProject(teamId ?? '');

  return {
    team,
    mayWrite: can(role, 'project:write'),
    search,
    setSearch,
    sort,
    setSort,
    archived,
    setArchived,
    projects,
    creating,
    setCreating,
    editingId,
    setEditingId,
    refusal,
    setRefusal,
    create,
    update,
    filtered: Boolean(settledSearch) || archived !== 'active',
  };
}
