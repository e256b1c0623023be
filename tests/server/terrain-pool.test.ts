import fs from 'node:fs';
import { deflateSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { createTerrainRunner, TerrainTimeoutError } from '../../server/analysis/terrain-pool';
import { nodeInflate } from '../../server/analysis/terrain-tasks';
import { TerrainError } from '../../terrain/errors';

const small = () => new Uint8Array(fs.readFileSync('tests/fixtures/dem/utm-f32-strips.tif'));
const demo = () => new Uint8Array(fs.readFileSync('datasets/harrow-fell-dem.tif'));

describe('nodeInflate', () => {
  it('inflates a block of its declared size', () => {
    const raw = new Uint8Array(4096).map((_, i) => i % 251);
    expect(Array.from(nodeInflate(deflateSync(raw), 4096))).toEqual(Array.from(raw));
  });

  it('stops a block that inflates far past its declared size with a TerrainError', () => {
    const bomb = deflateSync(Buffer.alloc(64 * 2 ** 20)); // 64 MiB of zeros in about 64 KB
    expect(() => nodeInflate(bomb, 1024)).toThrow(TerrainError);
    expect(() => nodeInflate(bomb, 1024)).toThrow(/inflates far past its declared 1024 bytes/);
  });
});

describe('terrain pool time limit', () => {
  const pool = createTerrainRunner({ threads: 1 });
  afterAll(() => pool.close());

  it('stops a task past its limit with a TerrainTimeoutError, replaces the thread and runs the next task', async () => {
    // a first task starts the thread (its start-up is not what the limit is about)
    expect((await pool.inspect(small())).metadata.width).toBe(9);
    // decoding the 8 MB demo grid and drawing its hillshade takes far longer than 1 ms
    const late = pool.inspect(demo(), { timeoutMs: 1 });
    const next = pool.inspect(small());
    await expect(late).rejects.toBeInstanceOf(TerrainTimeoutError);
    await expect(late).rejects.toThrow(/took longer than 1 ms and was stopped/);
    expect((await next).metadata.width).toBe(9);
  });
});

describe('terrain pool compiled (TERRAIN_THREADS_COMPILED)', () => {
  const pool = createTerrainRunner({ threads: 1, compiled: true });
  afterAll(() => pool.close());

  it('runs its threads from the entry compiled to one plain module, with the same answers as through the loader', async () => {
    const loader = createTerrainRunner({ threads: 1 });
    try {
      const [a, b] = await Promise.all([pool.inspect(small()), loader.inspect(small())]);
      expect(a.metadata).toEqual(b.metadata);
      expect(a.metadata.width).toBe(9);
    } finally {
      await loader.close();
    }
    // the compiled module sits beside the entry, hidden
    expect(fs.readdirSync('server/analysis').some((f) => /^\.terrain-thread\.[0-9a-f]+\.compiled\.mjs$/.test(f))).toBe(true);
  });
});

/** The nice value the priority tests give their pools. */
const ANALYSIS_THREAD_NICE = 10;

describe('terrain thread priority', () => {
  const pool = createTerrainRunner({ threads: 1, nice: ANALYSIS_THREAD_NICE });
  afterAll(() => pool.close());

  /** Nice value of each thread of this process: field 19 of /proc/self/task/TID/stat (proc(5)). */
  const niceOfThreads = () =>
    fs.readdirSync('/proc/self/task').map((tid) => Number(fs.readFileSync(`/proc/self/task/${tid}/stat`, 'utf8').replace(/^.*\) /, '').split(' ')[16]));

  it.runIf(process.platform === 'linux')('runs analyses at nice 10 while the rest of the process keeps its priority', async () => {
    const before = niceOfThreads();
    expect(before).not.toContain(ANALYSIS_THREAD_NICE);
    expect((await pool.inspect(small())).metadata.width).toBe(9); // the thread is started
    const after = niceOfThreads();
    expect(after.filter((n) => n === ANALYSIS_THREAD_NICE)).toHaveLength(1);
    expect(after.filter((n) => n === 0).length).toBeGreaterThanOrEqual(before.filter((n) => n === 0).length);
  });
});

describe('terrain pool warm start', () => {
  const pool = createTerrainRunner({ threads: 1, nice: ANALYSIS_THREAD_NICE });
  afterAll(() => pool.close());
  const threadIds = () => fs.readdirSync('/proc/self/task');

  it.runIf(process.platform === 'linux')('starts its thread on warm(), before any task, and runs the first task on it', async () => {
    const before = threadIds();
    pool.warm();
    const started = threadIds().filter((t) => !before.includes(t));
    // a worker thread is one JS thread plus a few of V8's; the new ones appear at once
    expect(started.length).toBeGreaterThan(0);
    expect((await pool.inspect(small())).metadata.width).toBe(9);
    pool.warm(); // already warm: no second thread
    expect((await pool.inspect(small())).metadata.width).toBe(9);
    const analysisThreads = threadIds().filter((t) => Number(fs.readFileSync(`/proc/self/task/${t}/stat`, 'utf8').replace(/^.*\) /, '').split(' ')[16]) === ANALYSIS_THREAD_NICE);
    expect(analysisThreads).toHaveLength(1);
    expect(started).toContain(analysisThreads[0]);
  });
});

describe('analyses over a stored file read by ranges', () => {
  const pool = createTerrainRunner({ threads: 1 });
  afterAll(() => pool.close());
  // a small area of the demo grid (extent lon 4.4668-4.4960, lat 46.7638-46.7803, datasets/README.md)
  const mission = {
    area: { type: 'Polygon', coordinates: [[[4.475, 46.768], [4.480, 46.768], [4.480, 46.771], [4.475, 46.771], [4.475, 46.768]]] },
    camera: { sensorWidthMm: 13.2, sensorHeightMm: 8.8, focalLengthMm: 8.8, imageWidthPx: 5472, imageHeightPx: 3648 },
    targetGsdCm: 2.5,
    takeoff: { lon: 4.478, lat: 46.769 },
  };

  it('gives the same plan from the file path (read in the thread by ranges) as from the bytes', async () => {
    const fromFile = await pool.analyse({ path: 'datasets/harrow-fell-dem.tif' }, mission);
    const fromBytes = await pool.analyse(demo(), mission);
    expect(fromFile.result.summary.photoCount).toBeGreaterThan(10);
    expect(fromFile.result).toEqual(fromBytes.result);
    // the same coverage run, apart from how long it took
    const untimed = (c: unknown) => JSON.parse(JSON.stringify(c, (k, v) => (k === 'timingMs' ? undefined : v)));
    expect(untimed(fromFile.coverage)).toEqual(untimed(fromBytes.coverage));
    expect(fromFile.files?.raster).toEqual(fromBytes.files?.raster);
  });

  it('gives the same plan from a range source (ranges asked of the main thread) while fetching part of the grid', async () => {
    const bytes = demo();
    let fetched = 0;
    const ranges = {
      byteLength: bytes.byteLength,
      async read(offset: number, length: number) {
        fetched += Math.min(length, bytes.byteLength - offset);
        return bytes.slice(offset, offset + length);
      },
    };
    const fromRanges = await pool.analyse(ranges, mission);
    const fromBytes = await pool.analyse(demo(), mission);
    expect(fromRanges.result).toEqual(fromBytes.result);
    expect(fromRanges.files?.raster).toEqual(fromBytes.files?.raster);
    expect(fetched).toBeGreaterThan(0);
    // the tiles under the area with the analysis margin (about half of this small grid's 20 tiles), not the whole file
    expect(fetched).toBeLessThan(bytes.byteLength * 0.6);
  });

  it('refuses a missing file with the error of the file system', async () => {
    await expect(pool.analyse({ path: 'datasets/no-such-grid.tif' }, mission)).rejects.toThrow(/ENOENT/);
  });
});
