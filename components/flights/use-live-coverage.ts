/** The leg sheet's live coverage: the server's LiveCoverage events (GET …/flights/:versionId/live, server-sent events) and what the card says of them. */
import { useEffect, useState } from 'react';
import { linkStateSchema, type LinkState } from '../../contracts/link-state';
import { liveCoverageSchema, type LiveCoverage } from '../../contracts/live-coverage';
import { formatDayTime } from '../projects/format-date';
import type { UnitSystem } from '../../contracts/projects';
import { formatPercent } from '../projects/units';
import { formatLatLon } from './leg-format';

/** API path of a version's live coverage stream. */
export const liveCoveragePath = (teamId: string, versionId: string, map = false) => `/api/teams/${encodeURIComponent(teamId)}/flights/${encodeURIComponent(versionId)}/live${map ? '?map=1' : ''}`;

type LiveState =
  | { kind: 'unavailable'; reason: string }
  | { kind: 'waiting' }
  | { kind: 'live'; doc: LiveCoverage; connected: boolean };

/** What the card shows of one document: a headline, the spec items, and the short patches to re-fly (largest first). */
interface LiveView {
  headline: string;
  items: string[];
  patches: string[];
  refused: string | null;
}

/** Pure: the card's words for a document, heights and areas in the project's units. */
export function liveViewOf(doc: LiveCoverage, units: UnitSystem): LiveView {
  if (doc.state === 'empty') return { headline: 'No photos recorded yet: run the link with --follow while the aircraft flies.', items: [], patches: [], refused: null };
  if (doc.state === 'refused') return { headline: `${doc.photoCount} photos recorded.`, items: [], patches: [], refused: doc.reason };
  const where = doc.progress ? `, last matched to line ${doc.progress.line} station ${doc.progress.station}` : '';
  const missed = doc.missedSoFar ? `; ${doc.missedSoFar} planned stations passed without a photo` : '';
  const area = (m2: number) => (units === 'imperial' ? `${Math.round(m2 * 10.7639).toLocaleString('en-GB')} sq ft` : `${Math.round(m2).toLocaleString('en-GB')} m²`);
  const passed = doc.passed;
  return {
    headline: `${doc.photoCount} photos recorded${where}${missed}. ${formatPercent(doc.flown?.shareAll ?? 0, 1)} of the area meets the whole spec so far.`,
    items: (doc.flown?.items ?? []).map((i) => `${i.asks}: ${formatPercent(i.share, 1)} of the area`),
    patches: passed && passed.shortCells > 0
      ? passed.patches.map((p) => `${area(p.areaM2)} short of the spec around ${formatLatLon(p.centroid)}`)
      : [],
    refused: null,
  };
}

/** Pure: the card's state before or without a stream. */
export function liveStateOf(q: { signedOff: boolean; offline: boolean; teamId: string | undefined; canStream: boolean; doc: LiveCoverage | null; connected: boolean }): LiveState {
  if (!q.signedOff) return { kind: 'unavailable', reason: 'Live coverage is for signed-off versions only.' };
  if (q.doc) return { kind: 'live', doc: q.doc, connected: q.connected && !q.offline };
  if (q.offline) return { kind: 'unavailable', reason: 'Live coverage needs the connection back.' };
  if (!q.canStream) return { kind: 'unavailable', reason: 'This browser cannot receive live updates (no EventSource).' };
  return { kind: 'waiting' };
}

const stepWords: Record<LinkState['step'], string> = {
  connecting: 'connecting to the aircraft',
  uploading: 'uploading the mission',
  verifying: 'reading the mission back',
  ready: 'ready: the mission on the aircraft matches this version',
  following: 'following the flight',
  finished: 'flight followed to the end',
  'not-ready': 'NOT ready',
};

/** Pure: the link's latest report in one line (step, aircraft, connection, when and by whom). */
export function linkLineOf(l: LinkState): string {
  const aircraft = l.aircraft ? `aircraft ${l.aircraft.sysid}/${l.aircraft.compid} (MAVLink ${l.aircraft.mavlink}) ` : '';
  return `Link: ${stepWords[l.step]}. ${l.message} ${aircraft}over ${l.connection}; reported ${formatDayTime(l.reportedAt)} by ${l.reportedBy}.`;
}

/** Subscribe to the version's live coverage and its link's reports while the sheet is open, online and signed off. */
export function useLiveCoverage(teamId: string | undefined, versionId: string, signedOff: boolean, offline: boolean, opts: { map?: boolean } = {}): { live: LiveState; link: LinkState | null } {
  const map = opts.map ?? false;
  const [doc, setDoc] = useState<LiveCoverage | null>(null);
  const [link, setLink] = useState<LinkState | null>(null);
  const [connected, setConnected] = useState(false);
  const canStream = typeof EventSource !== 'undefined';
  useEffect(() => {
    if (!teamId || !signedOff || offline || !canStream) return;
    // Same origin: the session cookie goes with the request; EventSource reconnects by itself after a drop.
    const es = new EventSource(liveCoveragePath(teamId, versionId, map));
    es.onopen = () => setConnected(true);
    es.onerror = () => setConnected(false);
    es.addEventListener('coverage', (e) => {
      const parsed = liveCoverageSchema.safeParse(JSON.parse((e as MessageEvent<string>).data));
      if (parsed.success) setDoc(parsed.data);
    });
    es.addEventListener('link', (e) => {
      const parsed = linkStateSchema.safeParse(JSON.parse((e as MessageEvent<string>).data));
      if (parsed.success) setLink(parsed.data);
    });
    return () => es.close();
  }, [teamId, versionId, signedOff, offline, canStream, map]);
  return { live: liveStateOf({ signedOff, offline, teamId, canStream, doc, connected }), link };
}
