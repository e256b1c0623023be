/** Entry of a terrain thread: runs the tasks of terrain-tasks.ts on messages from terrain-pool.ts. */
import fs from 'node:fs';
import os from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { loadDatumGrids } from './datum-grids';
import { installNodeCodecs } from './node-codecs';
import { analyseMission, analysisTransfer, checkAsFlown, inspectDem, nodeInflate } from './terrain-tasks';
import { analyseLiveCoverage } from '../mission-items/live-coverage.task';
import type { RangeAnswer, ThreadReply, ThreadTask } from './terrain-pool';
import type { ByteRangeSource } from '../../terrain/index';

const port = parentPort;
if (!port) throw new Error('terrain-thread.ts runs only as a worker thread.');
lowerThisThreadsPriority();
loadDatumGrids((workerData as { datumGridDir?: string } | null)?.datumGridDir);
installNodeCodecs();

/** Range requests of the running task waiting for the main thread's answer. */
const waiting = new Map<number, { resolve: (b: Uint8Array) => void; reject: (e: Error) => void }>();
let nextRead = 1;

/** A grid the main thread reads for us (an object store): each range is asked for and answered by message. */
function remoteSource(taskId: number, byteLength: number): ByteRangeSource {
  return {
    byteLength,
    read(offset, length) {
      const read = nextRead++;
      return new Promise<Uint8Array>((resolve, reject) => {
        waiting.set(read, { resolve, reject });
        port!.postMessage({ id: taskId, read, offset, length } satisfies ThreadReply);
      });
    },
  };
}

port.on('message', async (msg: ThreadTask | RangeAnswer) => {
  if ('rangeRead' in msg) {
    const w = waiting.get(msg.rangeRead);
    waiting.delete(msg.rangeRead);
    if ('bytes' in msg) w?.resolve(msg.bytes);
    else w?.reject(new Error(`The stored grid could not be read (${msg.error}).`));
    return;
  }
  const task = msg;
  const reply = (m: ThreadReply, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer);
  try {
    if (task.kind === 'inspect') {
      const grid = 'remote' in task.bytes ? remoteSource(task.id, task.bytes.remote.byteLength) : task.bytes;
      const r = await inspectDem(grid, task.opts);
      reply({ id: task.id, ok: true, value: r }, [r.hillshade.png.buffer as ArrayBuffer]);
    } else if (task.kind === 'as-flown') {
      reply({ id: task.id, ok: true, value: await checkAsFlown(task.bytes, task.mission, task.photos, task.opts) });
    } else if (task.kind === 'live-coverage') {
      reply({ id: task.id, ok: true, value: await analyseLiveCoverage(task.bytes, task.mission, task.plan, task.photos, nodeInflate) });
    } else {
      const grid = 'remote' in task.bytes ? remoteSource(task.id, task.bytes.remote.byteLength) : task.bytes;
      const r = await analyseMission(grid, task.mission, (pct) => reply({ id: task.id, progress: pct }), task.opts);
      reply({ id: task.id, ok: true, value: r }, analysisTransfer(r));
    }
  } catch (err) {
    const e = err as Error & { code?: string };
    reply({ id: task.id, ok: false, error: { name: e?.name ?? 'Error', code: e?.code, message: e?.message ?? String(err), stack: e?.stack } });
  }
});

/**
 * Analyses are long and nobody waits on them by the millisecond; API reads are short and a reader waits for each.
 * On Linux a thread has a nice value of its own (setpriority on its thread id; setpriority(2), "BUGS": the nice
 * value is per thread), so this thread steps back to the nice value the pool passes (ANALYSIS_NICE, 10 by default:
 * about a tenth of a nice-0 thread's share when both want the CPU, CFS weights 110 vs 1024, from memory) and the
 * reads keep their latency while an analysis runs; on an idle machine the analysis still gets every free cycle.
 * Elsewhere (no /proc/thread-self) it runs at normal priority.
 */
function lowerThisThreadsPriority(): void {
  try {
    const tid = Number(/task\/(\d+)$/.exec(fs.readlinkSync('/proc/thread-self'))?.[1]);
    if (Number.isInteger(tid) && tid > 0) os.setPriority(tid, (workerData as { nice?: number } | null)?.nice ?? 0);
  } catch {
    // not Linux, or not allowed: normal priority
  }
}
