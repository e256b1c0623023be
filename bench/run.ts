/**
 * `npm run bench`: Loftline's terrain engine against GDAL / numpy / scipy on an 8000 x 8000 float32 DEM.
 * JS and reference runs are interleaved round by round (the machine is shared), and medians are reported.
 * Not a test: prints a table, then one `ratio NAME = X (target T)` line per figure.
 */
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import { openDem, readDem } from '../terrain/dem';
import { sampleAlongLine, sampleGridCoords } from '../terrain/sample';
import { WGS84, createTransform } from '../terrain/crs';
import { createParallelDecoder } from './parallel-decode';
import { benchPlan } from './plan-bench';
import { benchCoverage } from './coverage-bench';
import { benchSolve } from './solve-bench';
import { nodeInflate } from '../cli/io';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const OUT = here('./out/');
const TILED = `${OUT}bench-tiled.tif`;
const STRIPED = `${OUT}bench-striped.tif`;
const PY = '/usr/bin/python3';
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const inflate = nodeInflate;

function ensureReferenceTools(): void {
  const haveRasterize = spawnSync('gdal_rasterize', ['--version'], { stdio: 'ignore' }).status === 0; // the coverage figures' reference
  if (haveRasterize && spawnSync(PY, ['-c', 'import osgeo, scipy, numpy'], { stdio: 'ignore' }).status === 0) return;
  console.log('bench: installing gdal-bin python3-gdal python3-numpy python3-scipy (Debian)');
  const sudo = process.getuid?.() === 0 ? [] : ['sudo'];
  const run = (args: string[]) => execFileSync(sudo[0] ?? args[0], sudo.length ? args : args.slice(1), { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  run(['apt-get', 'update', '-qq']);
  run(['apt-get', 'install', '-y', '-qq', '--no-install-recommends', 'gdal-bin', 'python3-gdal', 'python3-numpy', 'python3-scipy']);
}

function ensureDems(): void {
  if (existsSync(TILED) && existsSync(STRIPED)) return;
  console.log('bench: generating the 8000 x 8000 benchmark DEMs with GDAL (once, into bench/out/)');
  execFileSync(PY, [here('./make-bench-dem.py'), OUT], { stdio: 'inherit' });
}

/** The reference process: one JSON request per line, one reply per line. */
function startReference() {
  const child = spawn(PY, [here('./reference.py')], { stdio: ['pipe', 'pipe', 'inherit'] });
  const replies = createInterface({ input: child.stdout! })[Symbol.asyncIterator]();
  return {
    async call(req: object): Promise<any> {
      child.stdin!.write(`${JSON.stringify(req)}\n`);
      const r = await replies.next();
      const out = JSON.parse(r.value as string);
      if (out.error) throw new Error(out.error);
      return out;
    },
    close: () => child.stdin!.end(),
  };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
async function timeMs(fn: () => unknown): Promise<number> {
  const t = performance.now();
  await fn();
  return performance.now() - t;
}

/** 100 east-west flight lines across the grid (pixel rows), 7800 m long, and their read windows (+-60 m swath). */
function flightLines(width: number, height: number, t: readonly number[]) {
  const lines = [];
  for (let k = 0; k < 100; k++) {
    const row = 60 + (k * (height - 120)) / 99;
    const [x0, x1, y] = [t[0] + 100 * t[1], t[0] + (width - 100) * t[1], t[3] + row * t[5]];
    lines.push({ row, x0, x1, y, bbox: [x0, y - 60, x1, y + 60] as [number, number, number, number] });
  }
  return lines;
}

async function main(): Promise<void> {
  ensureReferenceTools();
  ensureDems();
  const load0 = loadavg()[0];
  const ref = startReference();
  const versions = await ref.call({ cmd: 'versions' });
  const tiledBytes = readFileSync(TILED);
  const stripedBytes = readFileSync(STRIPED);
  const header = (await openDem(tiledBytes)).header;
  const { width, height, transform: t } = header;
  const decodedBytes = width * height * 4;
  const lines = flightLines(width, height, t);
  const pixelWindows = lines.map((l) => {
    const r0 = Math.floor((l.bbox[3] - t[3]) / t[5]), r1 = Math.ceil((l.bbox[1] - t[3]) / t[5]);
    const c0 = Math.floor((l.x0 - t[0]) / t[1]), c1 = Math.ceil((l.x1 - t[0]) / t[1]);
    return [c0, r0, c1 - c0, r1 - r0];
  });
  const par = await createParallelDecoder(tiledBytes, 2);
  const rows: Record<string, { js: number[]; ref: number[] }> = {};
  const add = (name: string, js: number, r: number) => ((rows[name] ??= { js: [], ref: [] }).js.push(js), rows[name].ref.push(r));

  let full = await readDem(tiledBytes, { inflate });
  const gdalCheck = (await ref.call({ cmd: 'decode', file: TILED, threads: 1 })).check;
  if (Math.fround(gdalCheck) !== full.data[4321 * width + 1234]) throw new Error('decoded pixel differs from GDAL');
  for (let round = 0; round < ROUNDS; round++) {
    add('full decode, DEFLATE + float predictor, 512-px tiles, 1 thread', await timeMs(async () => { full = await readDem(tiledBytes, { inflate }); }), (await ref.call({ cmd: 'decode', file: TILED, threads: 1 })).ms);
    add('full decode, same file, 2 threads', await timeMs(() => par.decode()), (await ref.call({ cmd: 'decode', file: TILED, threads: 2 })).ms);
    add('full decode, uncompressed striped', await timeMs(() => readDem(stripedBytes)), (await ref.call({ cmd: 'decode', file: STRIPED, threads: 1 })).ms);
    let checkJs = 0;
    const jsLines = await timeMs(async () => {
      const dem = await openDem(tiledBytes, { inflate }); // fresh block cache each round, as GDAL's fresh dataset
      for (const l of lines) {
        const g = await dem.read({ window: { bbox: l.bbox, marginPx: 0 } });
        checkJs += g.data[(g.height >> 1) * g.width + (g.width >> 1)];
      }
    });
    add('windows under 100 flight lines (read only those tiles)', jsLines, (await ref.call({ cmd: 'lines', file: TILED, windows: pixelWindows })).ms);
  }
  await par.close();

  // 1,000,000 bilinear samples along the 100 lines, 10,000 per line, on the decoded grid
  const n = 1_000_000, xs = new Float64Array(n), ys = new Float64Array(n), cols: number[] = [], prow: number[] = [];
  lines.forEach((l, k) => {
    for (let i = 0; i < 10_000; i++) {
      const j = k * 10_000 + i;
      xs[j] = l.x0 + ((l.x1 - l.x0) * (i + 0.37)) / 10_000;
      ys[j] = l.y + 0.31;
      cols.push((xs[j] - t[0]) / t[1] - 0.5);
      prow.push((ys[j] - t[3]) / t[5] - 0.5);
    }
  });
  await ref.call({ cmd: 'load', file: TILED });
  await ref.call({ cmd: 'samples', cols, rows: prow });
  const values = new Float64Array(n);
  let maxDiff = 0;
  for (let round = 0; round < 3 * ROUNDS; round++) {
    const js = await timeMs(() => sampleGridCoords(full, xs, ys, values));
    const mc = await ref.call({ cmd: 'map_coordinates' });
    const np = await ref.call({ cmd: 'numpy_bilinear' });
    add('1M bilinear samples along 100 lines (vs scipy map_coordinates)', js, mc.ms);
    add('1M bilinear samples, same points (vs numpy indexing)', js, np.ms);
    mc.first.forEach((v: number, i: number) => (maxDiff = Math.max(maxDiff, Math.abs(v - values[i]))));
  }
  // end to end along WGS 84 lines: geodesic stations + transform + sampling (no reference counterpart)
  const toLonLat = createTransform(header.crs, WGS84);
  const along: number[] = [];
  for (let round = 0; round < ROUNDS; round++) {
    along.push(await timeMs(() => {
      for (const l of lines) sampleAlongLine(full, [toLonLat.forward(l.x0, l.y), toLonLat.forward(l.x1, l.y)], { stepM: 0.78 });
    }));
  }

  // peak memory in fresh processes
  const windowsFile = `${OUT}line-windows.json`;
  writeFileSync(windowsFile, JSON.stringify(lines.map((l) => l.bbox)));
  const probe = (mode: string) => JSON.parse(execFileSync(process.execPath, ['--expose-gc', '--import', 'tsx', here('./memory-probe.ts'), TILED, mode, windowsFile], { encoding: 'utf8' }));
  const memFull = probe('full');
  const memLines = probe('lines');
  const memGdal = await ref.call({ cmd: 'memory', file: TILED });
  const plan = await benchPlan(tiledBytes, header, inflate);
  ref.close();

  const fmt = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);
  console.log(`\nLoftline terrain benchmark: ${width} x ${height} float32 DEM, medians of ${ROUNDS} interleaved rounds (samples: ${3 * ROUNDS})`);
  console.log(`reference: GDAL ${versions.gdal}, numpy ${versions.numpy}, scipy ${versions.scipy} (python ${versions.python}); Node ${process.version}, ${import.meta.url.endsWith('.compiled.mjs') ? 'compiled to plain JavaScript and run by plain node, without the TypeScript loader (as TERRAIN_THREADS_COMPILED runs the terrain threads)' : 'through the TypeScript loader'}; ${cpus().length} cores; load average ${load0.toFixed(1)} -> ${loadavg()[0].toFixed(1)}`);
  console.log('| step | Loftline (TypeScript) | reference | ratio |');
  console.log('| --- | --- | --- | --- |');
  const ratio: Record<string, number> = {};
  for (const [name, r] of Object.entries(rows)) {
    const js = median(r.js), rf = median(r.ref);
    ratio[name] = js / rf;
    console.log(`| ${name} | ${fmt(js)} | ${fmt(rf)} | ${(js / rf).toFixed(2)} |`);
  }
  console.log(`| 1M samples end to end along WGS 84 lines (geodesic stations, UTM transform, bilinear) | ${fmt(median(along))} | - | - |`);
  console.log(`| peak memory, full decode (working set beyond the file bytes) | ${(memFull.workBytes / 2 ** 20).toFixed(0)} MiB for ${(memFull.decodedBytes / 2 ** 20).toFixed(0)} MiB decoded | GDAL ${(memGdal.peakBytes / 2 ** 20).toFixed(0)} MiB | ${(memFull.workBytes / memFull.decodedBytes).toFixed(2)} (GDAL ${(memGdal.peakBytes / memGdal.decodedBytes).toFixed(2)}) |`);
  console.log(`| peak memory, 100 line windows (64 MiB block cache) | ${(memLines.workBytes / 2 ** 20).toFixed(0)} MiB for ${(memLines.decodedBytes / 2 ** 20).toFixed(0)} MiB decoded | - | ${(memLines.workBytes / memLines.decodedBytes).toFixed(2)} |`);
  console.log(`| plan, 2 km2 at 2 cm GSD | ${plan.seconds === null ? 'TODO' : fmt(plan.seconds * 1000)} | - | ${plan.note} |`);
  const coverageRatios = await benchCoverage(ROUNDS);
  const solveRatios = await benchSolve();
  console.log(`check: max |Loftline - map_coordinates| over 1000 samples = ${maxDiff.toExponential(2)} m; decoded pixel equals GDAL's`);
  console.log('');
  const memoryRatio = Math.max(memFull.workBytes / memFull.decodedBytes, memLines.workBytes / memLines.decodedBytes);
  console.log(`ratio sample-vs-scipy = ${ratio['1M bilinear samples along 100 lines (vs scipy map_coordinates)'].toFixed(2)} (target 0.5)`);
  console.log(`ratio decode-vs-gdal = ${ratio['full decode, DEFLATE + float predictor, 512-px tiles, 1 thread'].toFixed(2)} (target 1.0)`);
  console.log(`ratio decode-2-threads-vs-gdal-2-threads = ${ratio['full decode, same file, 2 threads'].toFixed(2)} (target < 1.0: faster than GDAL when both cores work)`);
  console.log(`ratio lines-vs-gdal = ${ratio['windows under 100 flight lines (read only those tiles)'].toFixed(2)} (target 1.5)`);
  console.log(`ratio memory-vs-decoded = ${memoryRatio.toFixed(2)} (target 1.5)`);
  console.log(plan.seconds === null ? `ratio plan-2km2-seconds = TODO (absolute seconds, no reference): ${plan.note}` : `ratio plan-2km2-seconds = ${plan.seconds.toFixed(2)} (absolute seconds, no reference; ${plan.note})`);
  for (const line of coverageRatios) console.log(line);
  for (const line of solveRatios) console.log(line);
}

main().catch((err) => {
  console.error(`bench failed: ${err instanceof Error ? err.stack : err}`);
  process.exitCode = 1;
});
