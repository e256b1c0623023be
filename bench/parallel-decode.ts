/** Full-grid decode on several threads into one shared Float32Array (tile rows handed out as threads finish). */
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { openDem, type DemSource } from '../terrain/dem';
import { nodeInflate } from '../cli/io';

const inflate = nodeInflate;

interface Job { out: SharedArrayBuffer; counter: SharedArrayBuffer; rowsPerChunk: number }

/** Take chunks of rows from the shared counter until none is left, decoding each into the shared output. */
async function drain(dem: DemSource, job: Job): Promise<void> {
  const { width, height } = dem.header;
  const out = new Float32Array(job.out);
  const counter = new Int32Array(job.counter);
  for (;;) {
    const r0 = Atomics.add(counter, 0, 1) * job.rowsPerChunk;
    if (r0 >= height) break;
    const r1 = Math.min(height, r0 + job.rowsPerChunk);
    await dem.read({ pixelWindow: [0, r0, width, r1], into: out.subarray(r0 * width, r1 * width), maxPixels: width * height });
  }
}

if (!isMainThread) {
  const { file } = workerData as { file: SharedArrayBuffer };
  let dem: DemSource | null = null;
  parentPort!.on('message', async (job: Job) => {
    dem ??= await openDem(new Uint8Array(file), { inflate, cacheBytes: 0 });
    await drain(dem, job);
    parentPort!.postMessage('done');
  });
}

/** The calling thread plus `threads - 1` workers over the file bytes (copied once into shared memory). */
export async function createParallelDecoder(bytes: Uint8Array, threads: number) {
  const file = new SharedArrayBuffer(bytes.byteLength);
  new Uint8Array(file).set(bytes);
  const main = await openDem(bytes, { inflate, cacheBytes: 0 });
  const header = main.header;
  const workers = Array.from({ length: threads - 1 }, () => new Worker(new URL('./parallel-worker.mjs', import.meta.url), { workerData: { file } }));
  return {
    /** Decode the whole grid; resolves with the shared output. */
    async decode(): Promise<Float32Array> {
      const out = new SharedArrayBuffer(header.width * header.height * 4);
      const counter = new SharedArrayBuffer(4);
      const rowsPerChunk = header.tiling.tiled ? header.tiling.blockHeight : 512;
      const job: Job = { out, counter, rowsPerChunk };
      const done = workers.map((w) => new Promise<void>((resolve, reject) => {
        w.once('message', () => resolve());
        w.once('error', reject);
        w.postMessage(job);
      }));
      await drain(main, job);
      await Promise.all(done);
      return new Float32Array(out);
    },
    close: () => Promise.all(workers.map((w) => w.terminate())),
  };
}
