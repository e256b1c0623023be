/** A fresh team with the demo grid as its site, for the survey-area size checks, and the probes they share. */
import fs from 'node:fs';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { expect } from 'vitest';
import { ApiClient, uniqueEmail } from './http-client';
import type { TestServer } from './test-server';

export interface AreaLimitsFixture {
  c: ApiClient;
  plansPath: string;
  /** A plan body over the demo grid (extent lon 4.4668-4.4960, lat 46.7638-46.7803, datasets/README.md). */
  planBody: (ring: number[][], name?: string) => Record<string, unknown>;
}

export async function areaLimitsFixture(srv: TestServer, tag: string): Promise<AreaLimitsFixture> {
  const c = new ApiClient(srv.url);
  const email = uniqueEmail(tag);
  await c.signUp(email, 'area limits password', 'Area Limits');
  await c.signIn(email, 'area limits password');
  const teamId = (await c.post('/api/teams', { name: `Team ${tag}` })).body.id;
  const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Area limits' })).body.id;
  const f = new FormData();
  f.append('surfaceKind', 'bare-earth');
  f.append('file', new Blob([new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'))]), 'harrow-fell-dem.tif');
  const site = await c.request('POST', `/api/teams/${teamId}/projects/${projectId}/sites`, { body: f });
  expect(site.status).toBe(201);
  const siteId = site.body.id as string;
  const planBody = (ring: number[][], name = 'Traced boundary') => ({
    name,
    siteId,
    input: {
      area: { type: 'Polygon', coordinates: [ring] },
      camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
      targetGsdCm: 2.5,
      takeoff: { lon: 4.478, lat: 46.768 },
    },
  });
  return { c, plansPath: `/api/teams/${teamId}/projects/${projectId}/plans`, planBody };
}

/** Ask /api/health every 25 ms for `ms`: how long the answers took, and the longest event-loop stall meanwhile. */
export async function probeHealth(url: string, ms: number) {
  const loopDelay = monitorEventLoopDelay({ resolution: 10 });
  loopDelay.enable();
  const latencies: number[] = [];
  const until = Date.now() + ms;
  while (Date.now() < until) {
    const t0 = performance.now();
    const h = await fetch(`${url}/api/health`);
    await h.text();
    latencies.push(performance.now() - t0);
    expect(h.status).toBe(200);
    await new Promise((r) => setTimeout(r, 25));
  }
  loopDelay.disable();
  latencies.sort((a, b) => a - b);
  return { count: latencies.length, medianMs: latencies[Math.floor(latencies.length / 2)], p90Ms: latencies[Math.floor(latencies.length * 0.9)], worstMs: latencies[latencies.length - 1], loopMaxMs: loopDelay.max / 1e6 };
}
