/** Shared pieces of upload tests: a signed-in person with a project, the multipart form, files left in storage. */
import fs from 'node:fs';
import path from 'node:path';
import { ApiClient, uniqueEmail } from './http-client';
import type { TestServer } from './test-server';

/** Every file under a storage folder (temporary part files included), relative and sorted. */
export function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return (fs.readdirSync(dir, { recursive: true, withFileTypes: true }) as fs.Dirent[])
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath ?? (e as unknown as { path: string }).path, e.name)))
    .sort();
}

/** A new person who owns a team with one project; `base` is the project's sites path. */
export async function ownProject(s: TestServer, tag: string) {
  const c = new ApiClient(s.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'uploads password', tag);
  await c.signIn(email, 'uploads password');
  const team = (await c.post('/api/teams', { name: `Team ${tag}` })).body as { id: string };
  const project = (await c.post(`/api/teams/${team.id}/projects`, { name: `Project ${tag}` })).body as { id: string };
  return { c, teamId: team.id, projectId: project.id, base: `/api/teams/${team.id}/projects/${project.id}/sites` };
}

/** Upload `file` as a DEM with the usual fields (every field valid: only the file can be at fault). */
export function uploadDem(c: ApiClient, base: string, file: Uint8Array, fields: Record<string, string> = { surfaceKind: 'bare-earth', verticalDatum: 'EGM96' }) {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.append(k, v);
  f.append('file', new Blob([new Uint8Array(file)], { type: 'image/tiff' }), 'dem.tif');
  return c.request('POST', base, { body: f });
}
