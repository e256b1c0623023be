/** What every export of a version is written from: its lines and legs, waypoints, datum and cautions. */
import { reviewStateSchema } from '../../contracts/reviews';
import { buildLegSheet } from '../flights/leg-sheet.build';
import { heightDatumOf, readResult } from '../versions/result-view';
import type { VersionRecord } from '../versions/versions.repository';
import { datumKindOf } from './datum';
import { waypointsOf } from './waypoints';

export function exportContext(v: VersionRecord, now: Date = new Date()) {
  const view = readResult(v.result);
  const sheet = buildLegSheet(v, now);
  const datumName = heightDatumOf(v);
  const datum = { name: datumName, kind: datumKindOf(datumName) };
  const waypoints = waypointsOf(view, datum);
  const state = reviewStateSchema.parse(v.reviewState);
  const title = `${v.planName} v${v.number} (${v.projectName})`;
  const slug = `${v.planName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'plan'}-v${v.number}`;
  return { v, view, sheet, datum, waypoints, signedOff: state === 'signed_off', cautions: sheet.cautions, title, slug, generatedAt: now.toISOString() };
}

export type ExportContext = ReturnType<typeof exportContext>;

/** One sentence naming the heights a file carries. */
export function heightsNote(ctx: ExportContext, carried: string): string {
  const approx = ctx.datum.kind === 'other' ? ` The grid's datum (${ctx.datum.name}) was taken as EGM96 for this conversion, which may be off by a metre or two.` : '';
  return `${carried} Altitudes above takeoff and above the grid's vertical datum (${ctx.datum.name}) are given for every waypoint.${approx}`;
}
