/**
 * The API's addresses, built in one place for the screens and for the server's own references to them (the app
 * shell's preload header names the same URLs the screens fetch, or the browser would fetch them twice).
 */
const seg = encodeURIComponent;

export const apiPaths = {
  me: '/api/me',
  team: (teamId: string) => `/api/teams/${seg(teamId)}`,
  flights: (teamId: string) => `${apiPaths.team(teamId)}/flights`,
  work: (teamId: string) => `${apiPaths.team(teamId)}/work`,
  legSheet: (teamId: string, versionId: string) => `${apiPaths.flights(teamId)}/${seg(versionId)}/leg-sheet`,
  plan: (teamId: string, planId: string) => `${apiPaths.team(teamId)}/plans/${seg(planId)}`,
  version: (teamId: string, planId: string, versionId: string) => `${apiPaths.plan(teamId, planId)}/versions/${seg(versionId)}`,
} as const;
