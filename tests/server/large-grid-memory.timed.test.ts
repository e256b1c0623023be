/**
 * A 512 MB grid costs the server little memory: the upload check reads the stored file by ranges and surveys it band
 * by band, and an analysis reads only the blocks under its plan. The server runs as its own process
 * (tests/support/server-process.ts) so its resident memory (VmRSS in /proc/<pid>/status) is its own; it is sampled
 * every 100 ms. The bound (under 300 MB above idle for a 512 MB grid) is the one the hardening issue asks for.
 * Timed, so it runs in the quiet pass after the parallel suites.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiClient, uniqueEmail } from '../support/http-client';
import { freePort } from '../support/test-server';

const MB = 2 ** 20;
// 11585 x 11585 Float32 = 536,848,900 bytes of heights (512 MB), within the default DEM_MAX_PIXELS (2^27)
const SIZE_PX = 11585;
const PIXEL_M = 0.5;
// centred on the demo area (lon 4.478, lat 46.769) in UTM 31N: cs2cs (PROJ 9.1.1) EPSG:4326 EPSG:32631 gives 612848.42 5180555.04
const CENTRE = [612848, 5180555];

let server: ChildProcess;
let url: string;
let tmp: string;
let gridPath: string;

function rssBytes(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
  if (!m) throw new Error(`no VmRSS for process ${pid}`);
  return Number(m[1]) * 1024;
}

/** Sample the server's RSS every 100 ms while `work` runs; the peak seen. */
async function peakWhile<T>(pid: number, work: () => Promise<T>): Promise<{ value: T; peak: number; samples: number }> {
  let peak = rssBytes(pid), samples = 1;
  const timer = setInterval(() => {
    try { peak = Math.max(peak, rssBytes(pid)); samples++; } catch { /* the process is gone: the work fails on its own */ }
  }, 100);
  try {
    const value = await work();
    peak = Math.max(peak, rssBytes(pid));
    return { value, peak, samples };
  } finally {
    clearInterval(timer);
  }
}

beforeAll(async () => {
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-large-grid-'));
  gridPath = path.join(tmp, 'large-grid.tif');
  // GDAL 3.6.2 gdal_create: a constant 312.5 m surface, uncompressed 256 x 256 tiles, every block written
  const half = (SIZE_PX * PIXEL_M) / 2;
  execFileSync('gdal_create', ['-q', '-of', 'GTiff', '-outsize', String(SIZE_PX), String(SIZE_PX), '-bands', '1', '-ot', 'Float32', '-burn', '312.5',
    '-a_srs', 'EPSG:32631', '-a_ullr', String(CENTRE[0] - half), String(CENTRE[1] + half), String(CENTRE[0] + half), String(CENTRE[1] - half),
    '-co', 'TILED=YES', '-co', 'BLOCKXSIZE=256', '-co', 'BLOCKYSIZE=256', gridPath]);
  const port = await freePort();
  url = `http://127.0.0.1:${port}`;
  server = spawn(process.execPath, ['--import', 'tsx', 'tests/support/server-process.ts'], {
    env: {
      ...process.env, PORT: String(port), NODE_ENV: 'test', WORKERS: '1', UPLOAD_LIMIT_MB: '600', STORAGE_DRIVER: 'disk', STORAGE_DIR: path.join(tmp, 'storage'),
      ANALYSIS_QUEUE: `large-grid-${port}`, MAIL_QUEUE: `mail-large-grid-${port}`, AUTH_SIGNIN_PER_MINUTE: '1000',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  server.stdout!.on('data', (d) => (out += d));
  server.stderr!.on('data', (d) => (out += d));
  const t0 = Date.now();
  while (!/ready http/.test(out)) {
    if (server.exitCode !== null) throw new Error(`the server process exited:\n${out}`);
    if (Date.now() - t0 > 60_000) throw new Error(`the server process did not start in 60 s:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}, 180_000);

afterAll(async () => {
  if (server && server.exitCode === null && server.signalCode === null) {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
  }
  if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

describe('memory for a 512 MB grid', () => {
  it('stays under 300 MB above idle while the upload is checked and a plan over it is analysed', { timeout: 600_000 }, async () => {
    expect(fs.statSync(gridPath).size).toBeGreaterThan(512 * MB);
    const pid = server.pid!;
    const c = new ApiClient(url);
    const email = uniqueEmail('large-grid');
    await c.signUp(email, 'large grid password', 'Large Grid');
    await c.signIn(email, 'large grid password');
    const teamId = (await c.post('/api/teams', { name: 'Team large grid' })).body.id;
    const projectId = (await c.post(`/api/teams/${teamId}/projects`, { name: 'Large grid' })).body.id;
    const sitesPath = `/api/teams/${teamId}/projects/${projectId}/sites`;
    const upload = async (file: Blob, name: string) => {
      const f = new FormData();
      f.append('surfaceKind', 'bare-earth');
      f.append('verticalDatum', 'EGM96');
      f.append('file', file, name);
      return c.request('POST', sitesPath, { body: f });
    };
    // idle: the server once warmed up by a small upload (its terrain thread started and its code loaded)
    const warm = await upload(new Blob([new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'))]), 'harrow-fell-dem.tif');
    expect(warm.status).toBe(201);
    await new Promise((r) => setTimeout(r, 1000));
    const idle = rssBytes(pid);

    // the file streams from disk (Node 20 fs.openAsBlob), so the test process does not hold it either
    const big = await peakWhile(pid, async () => upload(await fs.openAsBlob(gridPath), 'large-grid.tif'));
    expect(big.value.status).toBe(201);
    const site = big.value.body;
    expect(site.metadata).toMatchObject({ width: SIZE_PX, height: SIZE_PX, elevation: { min: 312.5, max: 312.5, mean: 312.5 }, nodataShare: 0 });

    const input = {
      area: { type: 'Polygon', coordinates: [[[4.475, 46.768], [4.480, 46.768], [4.480, 46.771], [4.475, 46.771], [4.475, 46.768]]] },
      camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
      targetGsdCm: 2.5,
      takeoff: { lon: 4.478, lat: 46.769 },
    };
    const plan = (await c.post(`/api/teams/${teamId}/projects/${projectId}/plans`, { name: 'Over the large grid', siteId: site.id, input })).body;
    const analysis = await peakWhile(pid, async () => {
      const run = (await c.post(`/api/teams/${teamId}/plans/${plan.id}/runs`, {})).body;
      let status: { analysisState: string; analysisError: string | null } = { analysisState: 'queued', analysisError: null };
      for (let t0 = Date.now(); Date.now() - t0 < 240_000; ) {
        status = (await c.get(`/api/teams/${teamId}/plans/${plan.id}/versions/${run.id}/status`)).body;
        if (status.analysisState === 'done' || status.analysisState === 'failed') break;
        await new Promise((r) => setTimeout(r, 250));
      }
      return status;
    });
    expect(analysis.value).toMatchObject({ analysisState: 'done' });

    const mb = (n: number) => `${(n / MB).toFixed(0)} MB`;
    console.info(`server RSS: idle ${mb(idle)}; upload check of a ${mb(fs.statSync(gridPath).size)} grid peaked at ${mb(big.peak)} (+${mb(big.peak - idle)}, ${big.samples} samples); ` +
      `analysis peaked at ${mb(analysis.peak)} (+${mb(analysis.peak - idle)}, ${analysis.samples} samples)`);
    expect(big.samples).toBeGreaterThan(5);
    expect(big.peak - idle).toBeLessThan(300 * MB);
    expect(analysis.peak - idle).toBeLessThan(300 * MB);
  });
});
