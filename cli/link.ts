/**
 * `npm run link -- …`: hand a signed-off plan version to an aircraft over MAVLink. Prints the cautions first, signs in
 * to Loftline, fetches the version's mission items (an unsigned version is refused), uploads them with the mission
 * protocol, reads them back, compares item by item, and only then says READY. Exit 0 when ready, 1 when anything
 * failed (nothing is ready), 2 for bad options.
 */
import { parseLinkArgs, usage, UsageError, type LinkOptions } from './link/args';
import crypto from 'node:crypto';
import { fetchMissionItems, LinkError, reportLinkState, signIn } from './link/loftline-client';
import type { LinkStep, ReportLinkState } from '../contracts/link-state';
import { MavlinkChannel } from './link/mavlink-channel';
import { followFlight } from './link/follow-flight';
import { compareMission, downloadMission, uploadMission, withHomeItem } from './link/mission-transfer';
import { openTransport } from './link/transport';
import { generalCautions } from '../contracts/cautions';
import { lineSettingRanges } from '../contracts/mission-items';

const out = (line: string) => process.stdout.write(`${line}\n`);

async function run(o: LinkOptions): Promise<void> {
  // The general cautions before anything else, then the plan's own once it is known.
  out('CAUTIONS');
  for (const c of generalCautions) out(`  - ${c}`);
  out(`Signing in to ${o.server} as ${o.email}`);
  const session = await signIn(o.server, o.email, o.password);
  const { doc, teamId } = await fetchMissionItems(session, o.versionId);
  out(`Version ${doc.version.number} of "${doc.version.planName}" (${doc.version.projectName}), signed off by ${doc.version.signedOffBy}${doc.version.signedOffAt ? ` on ${doc.version.signedOffAt}` : ''}`);
  out('CAUTIONS FOR THIS PLAN');
  for (const c of doc.cautions) out(`  - ${c}`);
  out(`Altitudes: ${doc.altitude.frameName} (frame ${doc.altitude.frame}), ${doc.altitude.reference}`);
  const span = (r: { min: number; max: number }) => (r.min === r.max ? `${r.min}` : `${r.min}-${r.max}`);
  for (const l of doc.lines) {
    const r = lineSettingRanges(l);
    const varies = r.triggerDistanceM.min !== r.triggerDistanceM.max || r.speedMps.min !== r.speedMps.max;
    out(`  line ${l.number}: items ${l.firstSeq}-${l.lastSeq}, ${l.photoCount} photos every ${span(r.triggerDistanceM)} m at ${span(r.speedMps)} m/s ground speed${varies ? ' (set per leg)' : ''}`);
  }
  out(`${doc.items.length} mission items`);

  const transport = await openTransport(o.connection);
  const ch = new MavlinkChannel(transport);
  // The leg sheet shows the link's step; reports are best effort and never stop the link.
  const run = crypto.randomUUID();
  let aircraft: ReportLinkState['aircraft'] = null;
  const report = (step: LinkStep, message: string) => reportLinkState(session, teamId, doc.version.id, { run, step, message, connection: transport.label, aircraft });
  try {
    ch.startHeartbeat();
    out(`Waiting for the aircraft's heartbeat on ${transport.label}`);
    await report('connecting', `Waiting for the aircraft's heartbeat on ${transport.label}.`);
    const target = await ch.findAircraft(Math.max(5000, o.timeoutMs * (o.retries + 1)));
    if (!target) throw new LinkError(`No MAVLink heartbeat from an aircraft on ${transport.label}; check the connection, the port and the baud rate. Nothing was uploaded.`);
    aircraft = { sysid: target.sysid, compid: target.compid, mavlink: target.version };
    out(`Aircraft: system ${target.sysid}, component ${target.compid}, MAVLink ${target.version}`);
    await report('uploading', `Uploading ${doc.items.length} mission items.`);
    const log = (line: string) => out(`  ${line}`);
    const items = o.homeItem ? withHomeItem(doc.items, doc.altitude.takeoff) : doc.items;
    if (o.homeItem) out('Item 0 is a placeholder for the autopilot\'s home position (--home-item); the plan starts at item 1.');
    const up = await uploadMission(ch, items, { timeoutMs: o.timeoutMs, retries: o.retries, log });
    out(`Uploaded ${items.length} items; the aircraft acknowledged them (MAV_MISSION_ACCEPTED)${up.resent ? `, ${up.resent} messages sent again after timeouts` : ''}`);
    out('Reading the mission back');
    await report('verifying', 'Reading the mission back and comparing it item by item.');
    const held = await downloadMission(ch, { timeoutMs: o.timeoutMs, retries: o.retries, log });
    const diffs = compareMission(items, held, o.homeItem ? 1 : 0);
    if (diffs.length) {
      for (const d of diffs.slice(0, 20)) out(`  MISMATCH ${d}`);
      const hint = !o.homeItem && diffs.some((d) => d.startsWith('item 0 ')) ? ' If the autopilot keeps its home position as item 0 (ArduPilot does), run the link again with --home-item.' : '';
      throw new LinkError(`The mission read back from the aircraft differs from version ${doc.version.number} in ${diffs.length} places: NOT ready. Clear the mission on the aircraft and run the link again.${hint}`);
    }
    out(`Read back ${held.length} items, each equal to what was sent${o.homeItem ? ' (item 0 is the autopilot\'s home)' : ''}.`);
    out(`READY: version ${doc.version.number} of "${doc.version.planName}" is on the aircraft (${held.length} items, altitudes above the takeoff point).`);
    await report('ready', `Version ${doc.version.number} is on the aircraft: ${held.length} items read back, each equal to what was sent.`);
    if (o.follow) {
      const stop = new AbortController();
      process.once('SIGINT', () => stop.abort());
      await report('following', 'Following the flight: photos go to Loftline as the aircraft reports them.');
      const n = await followFlight(ch, session, teamId, doc, items.length - 1, log, stop.signal);
      out(`Flight followed: ${n} photos recorded in Loftline.`);
      await report('finished', `Flight followed: ${n} photos recorded.`);
    }
  } catch (err) {
    await report('not-ready', (err instanceof Error ? err.message : String(err)).slice(0, 500));
    throw err;
  } finally {
    ch.stop();
    await transport.close();
  }
}

let options: LinkOptions;
try {
  options = parseLinkArgs(process.argv.slice(2), process.env);
} catch (err) {
  if (!(err instanceof UsageError)) throw err;
  process.stderr.write(`${err.message}\n${usage}\n`);
  process.exit(2);
}
run(options)
  .then(() => process.exit(0))
  .catch((err: unknown) => {
    process.stderr.write(`${err instanceof LinkError ? err.message : `The link failed: ${(err as Error)?.stack ?? String(err)}`}\n`);
    process.exit(1);
  });
