/** Entry of a terrain thread: runs the tasks of terrain-tasks.ts on messages from terrain-pool.ts. */
import { parentPort, workerData } from 'node:worker_threads';
import { loadDatumGrids } from './datum-grids';
import { installNodeCodecs } from './node-codecs';
import { analyseMission, analysisTransfer, checkAsFlown, inspectDem, nodeInflate } from './terrain-tasks';
import { analyseLiveCoverage } from '../mission-items/live-coverage.task';
import type { ThreadReply, ThreadTask } from './terrain-pool';

const port = parentPort;
if (!port) throw new Error('terrain-thread.ts runs only as a worker thread.');
loadDatumGrids((workerData as { datumGridDir?: string } | null)?.datumGridDir);
installNodeCodecs();

port.on('message', async (task: ThreadTask) => {
  const reply = (m: ThreadReply, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer);
  try {
    if (task.kind === 'inspect') {
      const r = await inspectDem(task.bytes, task.opts);
      reply({ id: task.id, ok: true, value: r }, [r.hillshade.png.buffer as ArrayBuffer]);
    } else if (task.kind === 'as-flown') {
      reply({ id: task.id, ok: true, value: await checkAsFlown(task.bytes, task.mission, task.photos, task.opts) });
    } else if (task.kind === 'live-coverage') {
      reply({ id: task.id, ok: true, value: await analyseLiveCoverage(task.bytes, task.mission, task.plan, task.photos, nodeInflate) });
    } else {
      const r = await analyseMission(task.bytes, task.mission, (pct) => reply({ id: task.id, progress: pct }), task.opts);
      reply({ id: task.id, ok: true, value: r }, analysisTransfer(r));
    }
  } catch (err) {
    const e = err as Error & { code?: string };
    reply({ id: task.id, ok: false, error: { name: e?.name ?? 'Error', code: e?.code, message: e?.message ?? String(err), stack: e?.stack } });
  }
});
