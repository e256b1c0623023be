/** Peak memory of one decode in a fresh process: prints JSON { workBytes, decodedBytes } (file bytes excluded). */
import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import { openDem } from '../terrain/dem';

const [file, mode, windowsJson] = process.argv.slice(2);
const inflate = (d: Uint8Array, n: number) => inflateSync(d, { chunkSize: Math.max(1024, n) });
const bytes = readFileSync(file); // a Buffer view: no second copy of the file
const dem = await openDem(bytes, { inflate, cacheBytes: mode === 'lines' ? undefined : 0 });
globalThis.gc?.();
const before = process.memoryUsage().rss;
const peakBefore = process.resourceUsage().maxRSS * 1024;
let keep = 0;
if (mode === 'lines') {
  const windows = JSON.parse(readFileSync(windowsJson, 'utf8')) as Array<[number, number, number, number]>;
  for (const bbox of windows) keep += (await dem.read({ window: { bbox, marginPx: 0 } })).data.length;
} else {
  keep = (await dem.read()).data.length;
}
const peak = process.resourceUsage().maxRSS * 1024;
process.stdout.write(`${JSON.stringify({ workBytes: peak - Math.max(before, 0), peakBefore, before, decodedBytes: dem.stats.pixelsDecoded * 4, outputPixels: keep })}\n`);
