/** Projects (GET/POST/PATCH /api/teams/:teamId/projects): the list with search, sort and filter, one project, create and edit. */
import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  projectListSchema,
  projectSchema,
  type CreateProject,
  type Project,
  type ProjectListQuery,
  type UpdateProject,
} from '../../contracts/projects';
import { apiFetch } from '../api/api-fetch';

/** Query keys for projects, per team. */
export const projectKeys = {
  all: ['projects'] as const,
  team: (teamId: string) => [...projectKeys.all, teamId] as const,
  lists: (teamId: string) => [...projectKeys.team(teamId), 'list'] as const,
  list: (teamId: string, query: ProjectListQuery) => [...projectKeys.lists(teamId), query] as const,
  detail: (teamId: string, projectId: string) => [...projectKeys.team(teamId), 'detail', projectId] as const,
};

/** /api/teams/:teamId/projects, the root of every project-owned resource. */
const projectsPath = (teamId: string) => `/api/teams/${encodeURIComponent(teamId)}/projects`;
export const projectPath = (teamId: string, projectId: string) => `${projectsPath(teamId)}/${encodeURIComponent(projectId)}`;

/** The query string of a list request; empty search text is left out. */
function listQueryString(query: ProjectListQuery): string {
  const p = new URLSearchParams();
  if (query.q && query.q.trim()) p.set('q', query.q.trim());
  if (query.sort) p.set('sort', query.sort);
  if (query.order) p.set('order', query.order);
  if (query.archived) p.set('archived', query.archived);
  const s = p.toString();
  return s ? `?${s}` : '';
}

/** The team's projects for a search/sort/filter; the previous list stays on screen while the next one loads. */
export function useProjects(teamId: string | undefined, query: ProjectListQuery, enabled = true) {
  return useQuery({
    queryKey: projectKeys.list(teamId ?? '', query),
    queryFn: ({ signal }) => apiFetch(`${projectsPath(teamId as string)}${listQueryString(query)}`, { schema: projectListSchema, signal }),
    enabled: Boolean(teamId) && enabled,
    placeholderData: keepPreviousData,
    select: (data) => data.projects,
  });
}

/** One project. */
export function useProject(teamId: string | undefined, projectId: string | undefined) {
  return useQuery({
    queryKey: projectKeys.detail(teamId ?? '', projectId ?? ''),
    queryFn: ({ signal }) => apiFetch(projectPath(teamId as string, projectId as string), { schema: projectSchema, signal }),
    enabled: Boolean(teamId && projectId),
  });
}

/** Creates a project (project:write); the lists refresh afterwards. */
export function useCreateProject(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProject) => apiFetch(projectsPath(teamId), { method: 'POST', body: input, schema: projectSchema }),
    onSuccess: (project) => {
      queryClient.setQueryData(projectKeys.detail(teamId, project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists(teamId) });
    },
  });
}

/** Renames, edits, archives (`archived: true`) or restores a project (project:write). */
export function useUpdateProject(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ projectId, change }: { projectId: string; change: UpdateProject }) =>
      apiFetch(projectPath(teamId, projectId), { method: 'PATCH', body: change, schema: projectSchema }),
    onSuccess: (project: Project) => {
      queryClient.setQueryData(projectKeys.detail(teamId, project.id), project);
      return queryClient.invalidateQueries({ queryKey: projectKeys.lists(teamId) });
    },
  });
}
