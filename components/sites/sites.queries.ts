/** Sites, the project's elevation uploads (/api/teams/:teamId/projects/:projectId/sites): list, one site, upload. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { apiFetch } from '../api/api-fetch';
import { projectKeys, projectPath } from '../projects/projects.queries';
import { ApiError } from '../api/api-error';
import { duplicateSiteErrorSchema, siteListSchema, siteSchema, type Site, type SurfaceKind } from './site-shape';
import { siteFileField } from '../../contracts/sites';
import { uploadWithProgress, type UploadProgress } from './upload-request';

/** Query keys for sites, per project. */
const siteKeys = {
  all: ['sites'] as const,
  project: (teamId: string, projectId: string) => [...siteKeys.all, teamId, projectId] as const,
  list: (teamId: string, projectId: string) => [...siteKeys.project(teamId, projectId), 'list'] as const,
  detail: (teamId: string, projectId: string, siteId: string) => [...siteKeys.project(teamId, projectId), 'detail', siteId] as const,
};

const sitesPath = (teamId: string, projectId: string) => `${projectPath(teamId, projectId)}/sites`;
const sitePath = (teamId: string, projectId: string, siteId: string) => `${sitesPath(teamId, projectId)}/${encodeURIComponent(siteId)}`;

/** The project's sites. */
export function useSites(teamId: string | undefined, projectId: string | undefined) {
  return useQuery({
    queryKey: siteKeys.list(teamId ?? '', projectId ?? ''),
    queryFn: ({ signal }) => apiFetch(sitesPath(teamId as string, projectId as string), { schema: siteListSchema, signal }),
    enabled: Boolean(teamId && projectId),
    select: (d) => d.sites,
  });
}

/** One site. */
export function useSite(teamId: string | undefined, projectId: string | undefined, siteId: string | undefined) {
  return useQuery({
    queryKey: siteKeys.detail(teamId ?? '', projectId ?? '', siteId ?? ''),
    queryFn: ({ signal }) => apiFetch(sitePath(teamId as string, projectId as string, siteId as string), { schema: siteSchema, signal }),
    enabled: Boolean(teamId && projectId && siteId),
  });
}

/** The 409 refusal of a file the project already has (same SHA-256), with the id of the existing site. */
export class DuplicateSiteError extends ApiError {
  constructor(message: string, readonly existingSiteId: string) {
    super(409, 'duplicate_site', message);
  }
}

/** What the upload form sends next to the file. */
interface SiteUploadFields {
  name: string;
  surfaceKind: SurfaceKind;
  /** Null: as the file's GeoKeys declare it. */
  verticalDatum: string | null;
}

/** Uploads a GeoTIFF with visible progress (site:write); `progress` is null when no upload runs. */
export function useUploadSite(teamId: string, projectId: string) {
  const queryClient = useQueryClient();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const mutation = useMutation({
    mutationFn: ({ file, fields }: { file: File; fields: SiteUploadFields }) => {
      const form = new FormData();
      form.append('name', fields.name);
      form.append('surfaceKind', fields.surfaceKind);
      if (fields.verticalDatum) form.append('verticalDatum', fields.verticalDatum);
      form.append(siteFileField, file, file.name); // last: the server checks the fields before it streams the file
      setProgress({ loadedBytes: 0, totalBytes: file.size, fraction: 0 });
      return uploadWithProgress({
        url: sitesPath(teamId, projectId),
        form,
        schema: siteSchema,
        onProgress: setProgress,
        interpretError: (status, body) => {
          const dup = duplicateSiteErrorSchema.safeParse(body);
          return status === 409 && dup.success ? new DuplicateSiteError(dup.data.error.message, dup.data.error.existingSiteId) : null;
        },
      });
    },
    onSettled: () => setProgress(null),
    onSuccess: (site: Site) => {
      queryClient.setQueryData(siteKeys.detail(teamId, projectId, site.id), site);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.list(teamId, projectId) }),
        queryClient.invalidateQueries({ queryKey: projectKeys.team(teamId) }),
      ]);
    },
  });
  return { ...mutation, progress };
}
