/**
 * Live coverage hub: per version, the latest as-flown analysis of the photos the link has recorded, recomputed on
 * a terrain thread when new photos arrive (at most once per `throttleMs`, and no sooner than three times the last run's
 * length after it began, so a large site never holds the terrain thread more than a third of the time; one run at a
 * time per version) and pushed
 * to every open stream of that version. Nothing is kept for a version nobody is watching.
 */
import { eq } from 'drizzle-orm';
import { flightCautions } from '../../contracts/cautions';
import type { FlightTrigger } from '../../contracts/flight-triggers';
import type { LinkState } from '../../contracts/link-state';
import type { LiveCoverage } from '../../contracts/live-coverage';
import type { Db } from '../../db/client';
import { site } from '../../db/schema';
import type { FlownPhoto } from '../../terrain/as-flown-match';
import type { PlanResult } from '../../terrain/index';
import type { TerrainRunner } from '../analysis/terrain-pool';
import { heightDatumOf, readMission } from '../versions/result-view';
import { createVersionsRepository } from '../versions/versions.repository';
import type { Storage } from '../storage/storage';
import { createFlightTriggersRepository } from './flight-triggers.repository';

/** A watcher of one version: its coverage documents and its link's reports. */
interface LiveListener {
  coverage: (doc: LiveCoverage) => void;
  link: (state: LinkState) => void;
}
type Listener = LiveListener;

/** Link reports kept, newest versions first (a bound, so a long-running server never grows with old flights). */
const LINK_STATES_KEPT = 500;

interface VersionState {
  teamId: string;
  listeners: Set<Listener>;
  doc: LiveCoverage | null;
  running: boolean;
  dirty: boolean;
  timer: ReturnType<typeof setTimeout> | null;
  lastStartMs: number;
  /** How long the last run took: the next starts no sooner than three times that after it began, so live runs hold the terrain thread a third of the time at most. */
  lastRunMs: number;
}

/** A recorded photo as the as-flown engine reads it: its height above the takeoff point, as the autopilot measured it. */
function flownPhotoOf(t: FlightTrigger & { sortie: string }): FlownPhoto {
  return {
    file: `${t.sortie.slice(0, 8)}-${t.imageIndex}`,
    lon: t.lon,
    lat: t.lat,
    altitudeM: t.altitudeAboveTakeoffM,
    altitudeRef: 'takeoff',
    yawDeg: t.yawDeg,
    pitchDeg: t.pitchDeg,
    rollDeg: t.rollDeg,
    time: t.capturedAt,
  };
}

/** Factory over the server's services; `throttleMs` is the least time between two runs for one version. */
export function createLiveCoverageHub(deps: { db: Db; storage: Storage; terrain: TerrainRunner; throttleMs: number; log?: (msg: string) => void }) {
  const versions = createVersionsRepository({ db: deps.db });
  const triggers = createFlightTriggersRepository({ db: deps.db });
  const states = new Map<string, VersionState>();
  const links = new Map<string, LinkState>();

  async function analyse(teamId: string, versionId: string): Promise<LiveCoverage> {
    const v = await versions.find({ teamId, versionId, role: 'owner' });
    if (!v) throw new Error(`version ${versionId} is gone`);
    const rows = await triggers.list(teamId, versionId);
    const datum = heightDatumOf(v);
    const mission = readMission(v.input);
    const base = {
      versionId,
      heights: `Photo heights are the autopilot's, above its home (the takeoff point), placed on the plan's takeoff ground height above ${datum}; arm elsewhere and every height is off by the difference.`,
      cautions: flightCautions({ surfaceKind: v.siteSurfaceKind === 'surface' ? 'surface' : 'bare-earth', verticalDatum: datum, maxAglM: mission.maxAglM, obstacleAllowanceM: mission.obstacleAllowanceM }),
      computedAt: new Date().toISOString(),
    };
    const none = { photoCount: rows.length, matched: 0, extra: 0, missedSoFar: 0, progress: null, raster: null, spec: null, flown: null, passed: null, map: null };
    if (rows.length === 0) return { ...base, ...none, state: 'empty', reason: null };
    const [s] = await deps.db.select({ storageKey: site.storageKey }).from(site).where(eq(site.id, v.siteId)).limit(1);
    if (!s) throw new Error(`site of version ${versionId} is gone`);
    const bytes = new Uint8Array(await deps.storage.getBytes(s.storageKey));
    try {
      const a = await deps.terrain.liveCoverage(bytes, v.input, v.result as PlanResult, rows.map(flownPhotoOf));
      return { ...base, ...a, state: 'ready', reason: null };
    } catch (err) {
      // A mission without a spec, or a raster too large, is refused by the engine with its reason.
      return { ...base, ...none, state: 'refused', reason: `Live coverage could not be computed: ${(err as Error).message}` };
    }
  }

  function schedule(versionId: string): void {
    const st = states.get(versionId);
    if (!st) return;
    if (st.running) { st.dirty = true; return; }
    if (st.timer) return;
    const waitMs = Math.max(0, st.lastStartMs + Math.max(deps.throttleMs, 3 * st.lastRunMs) - Date.now());
    st.timer = setTimeout(() => void run(versionId), waitMs);
    (st.timer as unknown as { unref?: () => void }).unref?.(); // a pending run never keeps the process alive
  }

  async function run(versionId: string): Promise<void> {
    const st = states.get(versionId);
    if (!st) return;
    st.timer = null;
    st.running = true;
    st.dirty = false;
    st.lastStartMs = Date.now();
    try {
      st.doc = await analyse(st.teamId, versionId);
      for (const l of st.listeners) l.coverage(st.doc);
    } catch (err) {
      deps.log?.(`live coverage of ${versionId} failed: ${(err as Error).stack ?? String(err)}`);
    } finally {
      st.lastRunMs = Date.now() - st.lastStartMs;
      st.running = false;
      if (st.listeners.size === 0) states.delete(versionId);
      else if (st.dirty) schedule(versionId);
    }
  }

  return {
    /** Watch a version: the latest analysis at once when there is one (else one is made), then every new one. */
    subscribe(teamId: string, versionId: string, listener: Listener): () => void {
      let st = states.get(versionId);
      if (!st) {
        st = { teamId, listeners: new Set(), doc: null, running: false, dirty: false, timer: null, lastStartMs: 0, lastRunMs: 0 };
        states.set(versionId, st);
      }
      st.listeners.add(listener);
      if (st.doc) listener.coverage(st.doc);
      else schedule(versionId);
      const link = links.get(versionId);
      if (link) listener.link(link);
      const own = st;
      return () => {
        own.listeners.delete(listener);
        if (own.listeners.size === 0 && !own.running) {
          if (own.timer) clearTimeout(own.timer);
          states.delete(versionId);
        }
      };
    },
    /** The link reported a step: kept as the version's latest and passed to its watchers. */
    reportLink(versionId: string, state: LinkState): void {
      links.delete(versionId);
      links.set(versionId, state);
      if (links.size > LINK_STATES_KEPT) links.delete(links.keys().next().value!);
      for (const l of states.get(versionId)?.listeners ?? []) l.link(state);
    },
    /** New photos were stored for a version: recompute for its watchers (throttled). */
    notify(versionId: string): void {
      schedule(versionId);
    },
  };
}
