/**
 * Long-lived answers (server-sent events) never end by themselves, and `server.close()` waits for every connection
 * to end: such answers are registered here and ended first when the server shuts down.
 */
import type { ServerResponse } from 'node:http';

/** End every open stream of the process (shutdown): the clients see the stream end and may reconnect elsewhere. */
export function endOpenStreams(set: Set<ServerResponse>): void {
  for (const res of set) res.end();
  set.clear();
}
