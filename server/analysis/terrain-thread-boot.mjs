// Plain-JS start of a terrain thread: worker threads do not inherit the TypeScript loader, so register tsx here first.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
