/**
 * Runs the heavy terrain tasks off the main thread, so decoding a large DEM or analysing a big plan never stalls
 * the API: a small pool of worker threads started on first use, one task per thread at a time, the rest waiting
 * in a queue. A task that runs past its time limit has its thread terminated (the only way to stop synchronous
 * decoding) and replaced, and its caller gets a TerrainTimeoutError. `threads: 0` runs the tasks inline (seed
 * scripts, debugging), without a time limit.
 */
import { fileURLToPath, URL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { TerrainError, type TerrainErrorCode } from '../../terrain/errors';
import { analyseMission, checkAsFlown, inspectDem, isRangeSource, nodeInflate, type AnalyseMissionOptions, type DemFile, type DemInspection, type MissionAnalysis } from './terrain-tasks';
import type { ByteRangeSource } from '../../terrain/index';
import type { AsFlownCheckDocument } from '../../terrain/as-flown-document';
import { analyseLiveCoverage, type LiveAnalysis } from '../mission-items/live-coverage.task';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import type { PlanResult } from '../../terrain/index';
import { loadDatumGrids } from './datum-grids';
import { installNodeCodecs } from './node-codecs';
import { compiledEntry } from './compiled-entry';

export type ThreadTask =
  /** `bytes` as a thread gets it: the bytes, a local path, or `remote` (each range asked of the main thread). */
  | { id: number; kind: 'inspect'; bytes: ThreadGrid; opts?: InspectOptions }
  | { id: number; kind: 'analyse'; bytes: ThreadGrid; mission: unknown; opts?: AnalyseMissionOptions }
  | { id: number; kind: 'as-flown'; bytes: Uint8Array; mission: unknown; photos: readonly FlownPhoto[]; opts?: AnalyseMissionOptions }
  | { id: number; kind: 'live-coverage'; bytes: Uint8Array; mission: unknown; plan: PlanResult; photos: FlownPhoto[] };

/** A grid as a terrain thread gets it. */
type ThreadGrid = Uint8Array | { path: string } | { remote: { byteLength: number } };

export type ThreadReply =
  | { id: number; progress: number }
  | { id: number; read: number; offset: number; length: number }
  | { id: number; ok: true; value: unknown }
  | { id: number; ok: false; error: { name: string; code?: string; message: string; stack?: string } };

/** Options of an upload's inspection: preview size, pixel limit, and a time limit for this task alone. */
interface InspectOptions {
  maxSizePx?: number;
  maxPixels?: number;
  timeoutMs?: number;
}

/** A terrain task stopped because it ran past its time limit. */
export class TerrainTimeoutError extends Error {
  constructor(readonly limitMs: number) {
    super(`The terrain work took longer than ${limitMs >= 1000 ? `${Math.round(limitMs / 1000)} s` : `${limitMs} ms`} and was stopped.`);
    this.name = 'TerrainTimeoutError';
  }
}

/** The terrain tasks, wherever they run. Bytes handed in are moved to the thread: do not use them afterwards. */
export interface TerrainRunner {
  /** Like `analyse`, `bytes` may be a local file or a range source: the upload check reads it band by band. */
  inspect(bytes: DemFile, opts?: InspectOptions): Promise<DemInspection>;
  /**
   * `bytes` may be a local file ({ path }), read by ranges in the thread, or a range source, whose ranges the
   * thread asks for one block at a time: either way the grid is never moved to the thread whole.
   */
  analyse(bytes: DemFile, mission: unknown, onProgress?: (pct: number) => void, opts?: AnalyseMissionOptions): Promise<MissionAnalysis>;
  /** A photo log checked against the plan of `mission` (terrain/as-flown-document.ts). */
  asFlown(bytes: Uint8Array, mission: unknown, photos: readonly FlownPhoto[], opts?: AnalyseMissionOptions): Promise<AsFlownCheckDocument>;
  /** Photos as flown so far against a stored plan (live coverage). */
  liveCoverage(bytes: Uint8Array, mission: unknown, plan: PlanResult, photos: FlownPhoto[]): Promise<LiveAnalysis>;
  /**
   * Start every thread now instead of at the first task: a process that runs analyses pays the threads' start-up
   * (about 1 s of CPU and 100 MB each, loading the terrain code) when it boots, not beside the reads of a busy moment.
   */
  warm(): void;
  close(): Promise<void>;
}

/** A task before it gets its id (Omit spread over each member of the union). */
type NewTask = ThreadTask extends infer T ? (T extends ThreadTask ? Omit<T, 'id'> : never) : never;

interface Pending {
  task: ThreadTask;
  timeoutMs?: number;
  resolve: (v: unknown) => void;
  reject: (e: Error) => void;
  onProgress?: (pct: number) => void;
  /** The range source a thread reads a remote grid from. */
  ranges?: ByteRangeSource;
}

/** The main thread's answer to a thread's range request. */
export type RangeAnswer = { rangeRead: number; bytes: Uint8Array } | { rangeRead: number; error: string };

interface Slot {
  worker: Worker;
  busy: Pending | null;
  timer?: ReturnType<typeof setTimeout>;
}

const bootFile = fileURLToPath(new URL('./terrain-thread-boot.mjs', import.meta.url));
const entryFile = new URL('./terrain-thread.ts', import.meta.url).href;

/**
 * What a terrain thread starts from: when `compiled`, the thread's entry compiled to plain JavaScript
 * (compiled-entry.ts: the terrain passes run about 6 % faster than through the development loader), else, or where
 * the compiler fails, the loader's start file with the TypeScript entry.
 */
function threadStart(compiled: boolean): { file: string; entry?: string } {
  if (!compiled) return { file: bootFile, entry: entryFile };
  try {
    return { file: compiledEntry(fileURLToPath(entryFile)) };
  } catch (err) {
    if (!compileFailed) console.error(`loftline: the terrain threads run through the TypeScript loader (compiling them failed: ${err instanceof Error ? err.message : String(err)})`);
    compileFailed = true;
    return { file: bootFile, entry: entryFile };
  }
}
let compileFailed = false;

/** A Uint8Array that owns its whole buffer (transferable without taking bytes that belong to someone else). */
function ownBuffer(b: Uint8Array): Uint8Array {
  return b.byteOffset === 0 && b.byteLength === b.buffer.byteLength && b.buffer instanceof ArrayBuffer ? b : new Uint8Array(b);
}

function rebuildError(e: { name: string; code?: string; message: string; stack?: string }): Error {
  const err = e.name === 'TerrainError' && e.code ? new TerrainError(e.code as TerrainErrorCode, e.message) : new Error(e.message);
  if (e.stack) err.stack = e.stack;
  return err;
}

/** Tasks run inline on the calling thread. */
export function createInlineTerrainRunner(): TerrainRunner {
  return {
    inspect: (bytes, opts) => inspectDem(bytes, opts),
    analyse: (bytes, mission, onProgress, o) => analyseMission(bytes, mission, onProgress, o),
    asFlown: (bytes, mission, photos, o) => checkAsFlown(bytes, mission, photos, o),
    liveCoverage: (bytes, mission, plan, photos) => analyseLiveCoverage(bytes, mission, plan, photos, nodeInflate),
    warm: () => {},
    close: async () => {},
  };
}

/** A pool of `threads` terrain threads (0: inline). */
/**
 * A pool of terrain threads; `nice` (0 normal … 19 lowest, default 0) lowers the threads' priority so that a
 * process's API requests keep their latency while analyses run (lowerThisThreadsPriority in terrain-thread.ts).
 */
export function createTerrainRunner(opts: { threads: number; taskTimeoutMs?: number; datumGridDir?: string; nice?: number; compiled?: boolean }): TerrainRunner {
  // the datum-shift grids in this thread (inline tasks, and CRSs the routes resolve) and, through workerData, in each terrain thread
  loadDatumGrids(opts.datumGridDir);
  installNodeCodecs();
  if (opts.threads <= 0) return createInlineTerrainRunner();
  // compiled (when asked for) now, with the process starting, not on the first request (about half a second)
  const compiled = opts.compiled ?? false;
  threadStart(compiled);
  const slots: Slot[] = [];
  const queue: Pending[] = [];
  let nextId = 1;
  let closed = false;

  function spawn(): Slot {
    const start = threadStart(compiled);
    const worker = new Worker(start.file, { workerData: { entry: start.entry, datumGridDir: opts.datumGridDir, nice: opts.nice ?? 0 } });
    const slot: Slot = { worker, busy: null };
    worker.unref(); // an idle pool never keeps the process alive
    worker.on('message', (m: ThreadReply) => {
      const p = slot.busy;
      if (!p || p.task.id !== m.id) return;
      if ('progress' in m) return p.onProgress?.(m.progress);
      if ('read' in m) {
        const answer = (a: RangeAnswer, transfer: ArrayBuffer[] = []) => slot.busy === p && worker.postMessage(a, transfer);
        if (!p.ranges) return answer({ rangeRead: m.read, error: 'This task has no range source.' });
        p.ranges.read(m.offset, m.length).then(
          (b) => {
            const own = ownBuffer(b);
            answer({ rangeRead: m.read, bytes: own }, [own.buffer as ArrayBuffer]);
          },
          (err: unknown) => answer({ rangeRead: m.read, error: (err as Error)?.message ?? String(err) }),
        );
        return;
      }
      slot.busy = null;
      clearTimeout(slot.timer);
      worker.unref();
      if (m.ok) p.resolve(m.value);
      else p.reject(rebuildError(m.error));
      dispatch();
    });
    const fail = (err: Error) => {
      const i = slots.indexOf(slot);
      if (i >= 0) slots.splice(i, 1);
      const p = slot.busy;
      slot.busy = null;
      clearTimeout(slot.timer);
      p?.reject(new Error(`The terrain thread stopped while working (${err.message}).`));
      dispatch();
    };
    worker.on('error', fail);
    worker.on('exit', (code) => fail(new Error(`exit code ${code}`)));
    slots.push(slot);
    return slot;
  }

  /** Stop a thread whose task ran too long: its caller hears why, a fresh thread takes the queue on. */
  function expire(slot: Slot, limitMs: number): void {
    const p = slot.busy;
    if (!p) return;
    slot.busy = null;
    const i = slots.indexOf(slot);
    if (i >= 0) slots.splice(i, 1);
    p.reject(new TerrainTimeoutError(limitMs));
    void slot.worker.terminate();
    dispatch();
  }

  function dispatch(): void {
    while (queue.length && !closed) {
      let slot = slots.find((s) => !s.busy);
      if (!slot && slots.length < opts.threads) slot = spawn();
      if (!slot) return;
      const p = queue.shift()!;
      slot.busy = p;
      slot.worker.ref();
      const limitMs = p.timeoutMs ?? opts.taskTimeoutMs;
      if (limitMs !== undefined) slot.timer = setTimeout(() => expire(slot, limitMs), limitMs);
      slot.worker.postMessage(p.task, p.task.bytes instanceof Uint8Array ? [p.task.bytes.buffer as ArrayBuffer] : []);
    }
  }

  function run<T>(task: NewTask, onProgress?: (pct: number) => void, timeoutMs?: number): Promise<T> {
    if (closed) return Promise.reject(new Error('The terrain pool is closed.'));
    const b = task.bytes as DemFile;
    const ranges = isRangeSource(b) ? b : undefined;
    const bytes = b instanceof Uint8Array ? ownBuffer(b) : ranges ? { remote: { byteLength: ranges.byteLength } } : b;
    const full = { ...task, id: nextId++, bytes } as ThreadTask;
    return new Promise<T>((resolve, reject) => {
      queue.push({ task: full, resolve: resolve as (v: unknown) => void, reject, onProgress, timeoutMs, ranges });
      dispatch();
    });
  }

  return {
    inspect: (bytes, o) => run<DemInspection>({ kind: 'inspect', bytes: bytes as never, opts: o && { maxSizePx: o.maxSizePx, maxPixels: o.maxPixels } }, undefined, o?.timeoutMs),
    analyse: (bytes, mission, onProgress, o) => run<MissionAnalysis>({ kind: 'analyse', bytes: bytes as never, mission, opts: o }, onProgress),
    asFlown: (bytes, mission, photos, o) => run<AsFlownCheckDocument>({ kind: 'as-flown', bytes, mission, photos, opts: o }),
    liveCoverage: (bytes, mission, plan, photos) => run<LiveAnalysis>({ kind: 'live-coverage', bytes, mission, plan, photos }),
    warm() {
      while (!closed && slots.length < opts.threads) spawn();
    },
    async close() {
      closed = true;
      for (const p of queue.splice(0)) p.reject(new Error('The terrain pool is closed.'));
      await Promise.all(slots.splice(0).map((s) => s.worker.terminate()));
    },
  };
}
