/**
 * Test data for the review, report, leg-sheet and export suites: a fresh team with one member per role, and plan
 * versions inserted straight into the database (project, site, plan, version) with the terrain engine's analysis
 * (analysePlan) of a small synthetic hill. Suites may build versions through the planner routes instead.
 */
import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Role } from '../../contracts/roles';
import type { ReviewState } from '../../contracts/reviews';
import { member, plan, planVersion, project, site, user } from '../../db/schema';
import { WGS84, createTransform, utmCrs } from '../../terrain/crs';
import { createGrid, type Grid } from '../../terrain/grid';
import { describeGrid } from '../../terrain/metadata';
import type { MissionInput } from '../../terrain/mission';
import { analysePlan } from '../../terrain/plan';
import { writeFloat32GeoTiff } from '../../terrain/geotiff-write';
import type { Storage } from '../../server/storage/storage';
import { solvePlan } from '../../terrain/solve';
import type { PlanResultData } from '../../contracts/plan-result';
import { ApiClient, uniqueEmail } from './http-client';
import { changingMembers } from '../../server/http/membership-cache';
import type { TestServer } from './test-server';

export const fixturePassword = 'fixture password 1';

interface FixtureUser {
  id: string;
  email: string;
  name: string;
}

export interface FreshTeam {
  teamId: string;
  clients: Record<Role, ApiClient>;
  users: Record<Role, FixtureUser>;
}

const names: Record<Role, string> = { owner: 'Wren Halloway', planner: 'Idris Quell', surveyor: 'Maren Toft', pilot: 'Cass Orrin' };

/** A new team (invented people) with one signed-in member per role, so suites never see each other's data. */
export async function freshTeam(srv: TestServer, tag = 'fx'): Promise<FreshTeam> {
  const clients = {} as Record<Role, ApiClient>;
  const users = {} as Record<Role, FixtureUser>;
  for (const role of ['owner', 'planner', 'surveyor', 'pilot'] as const) {
    const c = new ApiClient(srv.url);
    const email = uniqueEmail(`${tag}-${role}`);
    await c.signUp(email, fixturePassword, names[role]);
    const r = await c.signIn(email, fixturePassword);
    if (r.status !== 200) throw new Error(`fixture ${role} could not sign in: ${r.status}`);
    const [row] = await srv.db.select({ id: user.id }).from(user).where(eq(user.email, email));
    clients[role] = c;
    users[role] = { id: row.id, email, name: names[role] };
  }
  const t = await clients.owner.post('/api/teams', { name: `Fixture team ${tag}` });
  if (t.status !== 201) throw new Error(`fixture team not created: ${t.status}`);
  // Written straight to the table, as the API's own member writes do: through changingMembers, so the server's
  // membership cache learns of it.
  await changingMembers(srv.db, async () => {
    for (const role of ['planner', 'surveyor', 'pilot'] as const) {
      await srv.db.insert(member).values({ id: crypto.randomUUID(), organizationId: t.body.id, userId: users[role].id, role });
    }
  });
  return { teamId: t.body.id, clients, users };
}

/** UTM zone 30 north: a projected CRS in metres for the synthetic site. */
const siteCrs = utmCrs(30, false);
const origin = { e: 512_000, n: 6_012_000 };

/**
 * A 1 km x 1 km synthetic grid at 5 m: a ramp rising 30 m to the north and a 12 m round hill in the middle
 * (invented terrain, no real place). `hole` blanks a block of pixels (rows r0..r1, columns c0..c1, ends excluded).
 */
export function syntheticGrid(opts: { hole?: { rows: [number, number]; cols: [number, number] } } = {}): Grid {
  const width = 200;
  const height = 200;
  const px = 5;
  const data = new Float32Array(width * height);
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      const x = (c + 0.5) * px - 500;
      const y = 500 - (r + 0.5) * px;
      data[r * width + c] = 180 + 0.03 * (y + 500) + 12 * Math.exp(-(x * x + y * y) / (2 * 180 * 180));
    }
  }
  const h = opts.hole;
  if (h) for (let r = h.rows[0]; r < h.rows[1]; r++) for (let c = h.cols[0]; c < h.cols[1]; c++) data[r * width + c] = Number.NaN;
  return createGrid({ width, height, data, transform: [origin.e, px, 0, origin.n + 1000, 0, -px], crs: siteCrs });
}

/** A nodata block under the first lines of the fixture plan (x 300..350 m, y 150..250 m from the grid's south-west corner). */
export const fixtureHole = { rows: [150, 170] as [number, number], cols: [60, 70] as [number, number] };

const toLonLat = createTransform(siteCrs, WGS84);

/** The mission the fixtures analyse: a square area inside the grid, 3 cm GSD, hold mode. */
export function syntheticMission(overrides: Partial<MissionInput> = {}): MissionInput {
  const corner = (x: number, y: number) => toLonLat.forward(origin.e + x, origin.n + y) as [number, number];
  const ring = [corner(150, 150), corner(850, 150), corner(850, 850), corner(150, 850), corner(150, 150)];
  return {
    area: { type: 'Polygon', coordinates: [ring] },
    camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
    targetGsdCm: 3,
    gsdTolerance: 0.1,
    forwardOverlap: 0.8,
    sideOverlap: 0.7,
    headingDeg: 90,
    mode: 'hold',
    clearanceM: 30,
    obstacleAllowanceM: 0,
    maxAglM: 120,
    speedMps: 10,
    climbMps: 3,
    descentMps: 2,
    takeoff: (([lon, lat]) => ({ lon, lat }))(corner(500, 120)),
    enduranceMin: 25,
    batteryReserve: 0.25,
    ...overrides,
  };
}

let defaultResultJson: string | null = null;

/**
 * The terrain engine's analysis of the fixture mission over `grid` (default: the plain synthetic hill), as plain JSON,
 * what a version row stores. The default one is computed once per test file and handed out as fresh copies.
 */
export function analysedResult(grid?: Grid): PlanResultData {
  if (grid) return JSON.parse(JSON.stringify(analysePlan(grid, syntheticMission())));
  defaultResultJson ??= JSON.stringify(analysePlan(syntheticGrid(), syntheticMission()));
  return JSON.parse(defaultResultJson);
}

/**
 * A mission the solver plans over the synthetic hill with slow climb and descent limits (0.2 m/s), so that legs over
 * the hill fly slower than the mission's 10 m/s and every leg states its own photo spacing.
 */
export function solvedMission(): Record<string, unknown> {
  return { ...syntheticMission({ mode: 'follow', climbMps: 0.2, descentMps: 0.2 }), spec: { maxGsdCm: 3.3, minViews: 2 }, envelope: { preset: 'multirotor' }, solve: { repairRounds: 1 } };
}

let solvedResultJson: string | null = null;

/** The solver's plan of `solvedMission()` over the synthetic hill (legs carry speedMps and triggerDistanceM), as stored JSON. */
export function solvedResult(): PlanResultData {
  solvedResultJson ??= JSON.stringify(solvePlan(syntheticGrid(), solvedMission()));
  return JSON.parse(solvedResultJson);
}

export interface VersionFixture {
  projectId: string;
  siteId: string;
  planId: string;
  versionId: string;
  /** API path prefix of the version: /api/teams/:teamId/plans/:planId/versions/:versionId */
  path: string;
}

/** Insert a project, site, plan and one version (analysed unless told otherwise) for `teamId`. */
export async function createVersion(
  srv: TestServer,
  q: {
    teamId: string;
    createdBy: string;
    reviewState?: ReviewState;
    analysisState?: 'queued' | 'running' | 'done' | 'failed';
    result?: unknown;
    /** The stored mission (default: the synthetic mission). */
    input?: unknown;
    surfaceKind?: 'bare-earth' | 'surface';
    planName?: string;
  },
): Promise<VersionFixture> {
  const grid = syntheticGrid();
  const meta = describeGrid(grid);
  const analysed = (q.analysisState ?? 'done') === 'done';
  const [p] = await srv.db
    .insert(project)
    .values({ teamId: q.teamId, name: 'Hollin Fell quarry survey', client: 'Tarnside Aggregates (fictional)', createdBy: q.createdBy })
    .returning({ id: project.id });
  const [s] = await srv.db
    .insert(site)
    .values({
      teamId: q.teamId,
      projectId: p.id,
      name: 'Hollin Fell synthetic hill',
      fileName: 'hollin-fell-synthetic.tif',
      storageKey: `fixtures/${crypto.randomUUID()}.tif`,
      sizeBytes: grid.data.byteLength,
      sha256: crypto.randomBytes(32).toString('hex'),
      surfaceKind: q.surfaceKind ?? 'bare-earth',
      verticalDatum: 'EGM96 geoid',
      // A complete description (as an upload stores it) so that site reads answer with a valid shape; the hillshade
      // PNG itself is not stored, so only its description is.
      metadata: { ...meta, file: { compression: 'none', sampleType: 'float32', tiled: false, nodata: null, declaredVerticalDatum: null } },
      hillshadeKey: `fixtures/${crypto.randomUUID()}.png`,
      hillshade: { width: grid.width, height: grid.height, boundsWgs84: meta.boundsWgs84, transform: grid.transform },
      createdBy: q.createdBy,
    })
    .returning({ id: site.id });
  const input = q.input ?? syntheticMission();
  const [pl] = await srv.db
    .insert(plan)
    .values({ teamId: q.teamId, projectId: p.id, siteId: s.id, name: q.planName ?? 'North bench', input, createdBy: q.createdBy })
    .returning({ id: plan.id });
  const [v] = await srv.db
    .insert(planVersion)
    .values({
      teamId: q.teamId,
      planId: pl.id,
      number: 1,
      siteId: s.id,
      input,
      reviewState: q.reviewState ?? 'draft',
      analysisState: q.analysisState ?? 'done',
      analysisProgress: analysed ? 100 : 0,
      result: analysed ? (q.result ?? analysedResult()) : null,
      analysedAt: analysed ? new Date() : null,
      createdBy: q.createdBy,
      signedOffBy: q.reviewState === 'signed_off' ? q.createdBy : null,
      signedOffAt: q.reviewState === 'signed_off' ? new Date() : null,
    })
    .returning({ id: planVersion.id });
  return { projectId: p.id, siteId: s.id, planId: pl.id, versionId: v.id, path: `/api/teams/${q.teamId}/plans/${pl.id}/versions/${v.id}` };
}

/** Wait until `check` returns a value (polling), or fail after `timeoutMs`. */
export async function eventually<T>(check: () => Promise<T | null | undefined | false>, timeoutMs = 10_000, what = 'condition'): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await check();
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Put the synthetic hill, as a GeoTIFF, where the fixture site of `siteId` says its grid is (as an upload leaves it). */
export async function storeSyntheticDem(srv: TestServer, siteId: string): Promise<void> {
  const [s] = await srv.db.select({ storageKey: site.storageKey }).from(site).where(eq(site.id, siteId));
  const g = syntheticGrid();
  const tiff = writeFloat32GeoTiff({ width: g.width, height: g.height, bands: [g.data], bandNames: ['height'], transform: g.transform, epsg: g.crs.epsg!, geographic: false, nodata: -9999 });
  await (srv.services.storage as Storage).put(s.storageKey, tiff);
}
