/**
 * Long-lived answers (server-sent events) never end by themselves, and `server.close()` waits for every connection
 * to end: such answers are registered here and ended first when the server shuts down.
 */
import type { ServerResponse } from 'node:http';
import type { Services } from '../services';

/** The open streams of this server process (made on first use). */
export function openStreamsOf(services: Services): Set<ServerResponse> {
  let set = services.openStreams as Set<ServerResponse> | undefined;
  if (!set) {
    set = new Set();
    services.openStreams = set;
  }
  return set;
}

/** End every open stream (shutdown): the clients see the stream end and may reconnect elsewhere. */
export function endOpenStreams(services: Services): void {
  const set = openStreamsOf(services);
  for (const res of set) res.end();
  set.clear();
}
