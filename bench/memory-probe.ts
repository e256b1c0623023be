/** Peak memory of one decode in a fresh process: prints JSON { workBytes, decodedBytes } (file bytes excluded). */
import { readFileSync } from 'node:fs';
import { openDem } from '../terrain/dem';
import { nodeInflate } from '../cli/io';

/** This process's peak resident set (VmHWM, Linux): unlike getrusage's maxrss it is not inherited across exec. */
function peakRssBytes(): number {
  const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync('/proc/self/status', 'utf8'));
  return m ? Number(m[1]) * 1024 : process.resourceUsage().maxRSS * 1024;
}

const [file, mode, windowsJson] = process.argv.slice(2);
const inflate = nodeInflate;
const bytes = readFileSync(file); // a Buffer view: no second copy of the file
const dem = await openDem(bytes, { inflate, cacheBytes: mode === 'lines' ? undefined : 0 });
globalThis.gc?.();
const before = process.memoryUsage().rss;
const peakBefore = peakRssBytes();
let keep = 0;
if (mode === 'lines') {
  const windows = JSON.parse(readFileSync(windowsJson, 'utf8')) as Array<[number, number, number, number]>;
  for (const bbox of windows) keep += (await dem.read({ window: { bbox, marginPx: 0 } })).data.length;
} else {
  keep = (await dem.read()).data.length;
}
const peak = peakRssBytes();
process.stdout.write(`${JSON.stringify({ workBytes: peak - Math.max(before, 0), peakBefore, before, decodedBytes: dem.stats.pixelsDecoded * 4, outputPixels: keep })}\n`);
