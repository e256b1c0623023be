// Worker entry for bench/parallel-decode.ts: register tsx in this thread, then load the TypeScript worker body.
import { register } from 'tsx/esm/api';

register();
await import('./parallel-decode.ts');
