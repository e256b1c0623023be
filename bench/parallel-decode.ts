/** Full-grid decode on several worker threads into one shared Float32Array (tile rows handed out as they finish). */
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { openDem, type DemSource } from '../terrain/dem';
import { nodeInflate } from '../cli/io';

const inflate = nodeInflate;

interface Job { out: SharedArrayBuffer; counter: SharedArrayBuffer; rowsPerChunk: number }

if (!isMainThread) {
  const { file } = workerData as { file: SharedArrayBuffer };
  let dem: DemSource | null = null;
  parentPort!.on('message', async (job: Job) => {
    dem ??= await openDem(new Uint8Array(file), { inflate, cacheBytes: 0 });
    const { width, height } = dem.header;
    const out = new Float32Array(job.out);
    const counter = new Int32Array(job.counter);
    for (;;) {
      const k = Atomics.add(counter, 0, 1);
      const r0 = k * job.rowsPerChunk;
      if (r0 >= height) break;
      const r1 = Math.min(height, r0 + job.rowsPerChunk);
      await dem.read({ pixelWindow: [0, r0, width, r1], into: out.subarray(r0 * width, r1 * width), maxPixels: width * height });
    }
    parentPort!.postMessage('done');
  });
}

/** A pool of `threads` workers over the file bytes (copied once into shared memory). */
export async function createParallelDecoder(bytes: Uint8Array, threads: number) {
  const file = new SharedArrayBuffer(bytes.byteLength);
  new Uint8Array(file).set(bytes);
  const header = (await openDem(bytes, { cacheBytes: 0 })).header;
  const workers = Array.from({ length: threads }, () => new Worker(new URL('./parallel-worker.mjs', import.meta.url), { workerData: { file } }));
  return {
    /** Decode the whole grid; resolves with the shared output. */
    async decode(): Promise<Float32Array> {
      const out = new SharedArrayBuffer(header.width * header.height * 4);
      const counter = new SharedArrayBuffer(4);
      const rowsPerChunk = header.tiling.blockHeight * (header.tiling.tiled ? 1 : Math.max(1, Math.floor(512 / header.tiling.blockHeight)));
      await Promise.all(workers.map((w) => new Promise<void>((resolve, reject) => {
        w.once('message', () => resolve());
        w.once('error', reject);
        w.postMessage({ out, counter, rowsPerChunk } satisfies Job);
      })));
      return new Float32Array(out);
    },
    close: () => Promise.all(workers.map((w) => w.terminate())),
  };
}
