/** Plans and their versions: list per project, one plan, create, save, run (creates a version), poll a version. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../api/api-fetch';
import { apiPaths } from '../../contracts/api-paths';
import { projectKeys, projectPath } from '../projects/projects.queries';
import { planListSchema, planSchema, planVersionOverviewSchema, resultLineSchema, versionListSchema, versionStatusSchema, versionSummarySchema, type Plan, type VersionStatus, type VersionSummary } from './plan-shape';

/** Query keys for plans and versions, per team. */
export const planKeys = {
  all: ['plans'] as const,
  team: (teamId: string) => [...planKeys.all, teamId] as const,
  list: (teamId: string, projectId: string) => [...planKeys.team(teamId), 'list', projectId] as const,
  detail: (teamId: string, planId: string) => [...planKeys.team(teamId), 'detail', planId] as const,
  versions: (teamId: string, planId: string) => [...planKeys.detail(teamId, planId), 'versions'] as const,
  version: (teamId: string, planId: string, versionId: string) => [...planKeys.versions(teamId, planId), versionId] as const,
  status: (teamId: string, planId: string, versionId: string) => [...planKeys.version(teamId, planId, versionId), 'status'] as const,
  line: (teamId: string, planId: string, versionId: string, lineIndex: number) => [...planKeys.version(teamId, planId, versionId), 'line', lineIndex] as const,
};

const projectPlansPath = (teamId: string, projectId: string) => `${projectPath(teamId, projectId)}/plans`;
export const planPath = apiPaths.plan;
const versionsPath = (teamId: string, planId: string) => `${planPath(teamId, planId)}/versions`;
const versionPath = apiPaths.version;
const runsPath = (teamId: string, planId: string) => `${planPath(teamId, planId)}/runs`;

/** A version still being analysed is asked again this often. */
const pollIntervalMs = 1000;

export function isSettled(v: Pick<VersionStatus, 'analysisState'> | undefined): boolean {
  return v?.analysisState === 'done' || v?.analysisState === 'failed';
}

/** The plans of a project. */
export function usePlans(teamId: string | undefined, projectId: string | undefined) {
  return useQuery({
    queryKey: planKeys.list(teamId ?? '', projectId ?? ''),
    queryFn: ({ signal }) => apiFetch(projectPlansPath(teamId as string, projectId as string), { schema: planListSchema, signal }),
    enabled: Boolean(teamId && projectId),
    select: (d) => d.plans,
  });
}

/** One plan. */
export function usePlan(teamId: string | undefined, planId: string | undefined) {
  return useQuery({
    queryKey: planKeys.detail(teamId ?? '', planId ?? ''),
    queryFn: ({ signal }) => apiFetch(planPath(teamId as string, planId as string), { schema: planSchema, signal }),
    enabled: Boolean(teamId && planId),
  });
}

/** The versions of a plan, newest first as the server lists them. */
export function useVersions(teamId: string | undefined, planId: string | undefined) {
  return useQuery({
    queryKey: planKeys.versions(teamId ?? '', planId ?? ''),
    queryFn: ({ signal }) => apiFetch(versionsPath(teamId as string, planId as string), { schema: versionListSchema, signal }),
    enabled: Boolean(teamId && planId),
    select: (d) => d.versions,
  });
}

/** A version's analysis state and progress, polled every second until it is done or failed. */
export function useVersionStatus(teamId: string | undefined, planId: string | undefined, versionId: string | undefined) {
  return useQuery({
    queryKey: planKeys.status(teamId ?? '', planId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${versionPath(teamId as string, planId as string, versionId as string)}/status`, { schema: versionStatusSchema, signal }),
    enabled: Boolean(teamId && planId && versionId),
    refetchInterval: (q) => (isSettled(q.state.data) ? false : pollIntervalMs),
  });
}

/**
 * One version with its mission snapshot and its result's overview (every line's figures and station marks, no
 * stations); fetched once its analysis has settled (`ready`). A line's stations come with `useVersionLine`.
 */
export function useVersion(teamId: string | undefined, planId: string | undefined, versionId: string | undefined, ready = true) {
  return useQuery({
    queryKey: planKeys.version(teamId ?? '', planId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${versionPath(teamId as string, planId as string, versionId as string)}?part=overview`, { schema: planVersionOverviewSchema, signal }),
    enabled: Boolean(teamId && planId && versionId) && ready,
    staleTime: Infinity, // a settled version never changes
  });
}

/** One line of a settled version with its stations (for its chart), fetched when the line is chosen. */
export function useVersionLine(teamId: string | undefined, planId: string, versionId: string, lineIndex: number | null) {
  return useQuery({
    queryKey: planKeys.line(teamId ?? '', planId, versionId, lineIndex ?? -1),
    queryFn: ({ signal }) => apiFetch(`${versionPath(teamId as string, planId, versionId)}/lines/${lineIndex}`, { schema: resultLineSchema, signal }),
    enabled: Boolean(teamId) && lineIndex !== null,
    staleTime: Infinity,
  });
}

interface PlanDraft {
  name: string;
  siteId: string;
  input: Record<string, unknown>;
}

/** Creates a plan (plan:write). */
export function useCreatePlan(teamId: string, projectId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (draft: PlanDraft) => apiFetch(projectPlansPath(teamId, projectId), { method: 'POST', body: draft, schema: planSchema }),
    onSuccess: (plan: Plan) => {
      queryClient.setQueryData(planKeys.detail(teamId, plan.id), plan);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: planKeys.list(teamId, projectId) }),
        queryClient.invalidateQueries({ queryKey: projectKeys.team(teamId) }),
      ]);
    },
  });
}

/** Saves a plan's name and mission (plan:write). */
export function useUpdatePlan(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ planId, change }: { planId: string; change: Partial<Omit<PlanDraft, 'siteId'>> }) =>
      apiFetch(planPath(teamId, planId), { method: 'PATCH', body: change, schema: planSchema }),
    onSuccess: (plan: Plan) => {
      queryClient.setQueryData(planKeys.detail(teamId, plan.id), plan);
      return queryClient.invalidateQueries({ queryKey: planKeys.list(teamId, plan.projectId) });
    },
  });
}

/** Runs the analysis (plan:run): the server snapshots the saved plan into a new version and queues it (202). */
export function useRunPlan(teamId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ planId }: { planId: string }) => apiFetch(runsPath(teamId, planId), { method: 'POST', body: {}, schema: versionSummarySchema }),
    onSuccess: (v: VersionSummary) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: planKeys.detail(teamId, v.planId) }),
        queryClient.invalidateQueries({ queryKey: planKeys.team(teamId) }),
      ]),
  });
}
