/** The latest as-flown check in the compliance report: the spec as flown next to as planned, and what to re-fly. */
import type { AsFlownCheck } from '../../contracts/as-flown';
import { missedRuns, offTrackLines } from '../../contracts/as-flown-words';
import { itemTitle } from '../../contracts/coverage-words';
import type { ReportAsFlown } from '../../contracts/reports';

/** The report's as-flown section from the latest check (null before any). */
export function reportAsFlown(latest: AsFlownCheck | null, checkCount: number): ReportAsFlown | null {
  if (!latest) return null;
  const d = latest.document;
  const rf = d.reflight;
  return {
    checkedAt: latest.createdAt,
    checkedBy: latest.createdBy?.name ?? null,
    label: latest.label,
    photoCount: latest.photoCount,
    checkCount,
    shareAllFlown: d.flown.shareAll,
    shareAllPlanned: d.planned.shareAll,
    items: d.flown.items.map((it) => ({ item: it.item, title: itemTitle(it.item, d.spec), flown: it.share, planned: d.planned.items.find((x) => x.item === it.item)?.share ?? 0 })),
    matched: d.matching.matched,
    missedTriggers: d.matching.missed.length,
    missedRuns: missedRuns(d.matching.missed),
    extraPhotos: d.matching.extra.length,
    offTrack: offTrackLines(d.matching.lines),
    lostAreaM2: d.difference.lostAreaM2,
    reflight: rf === null
      ? 'Nothing to re-fly: no ground that met the spec as planned was lost in flight.'
      : rf.stretches && rf.stretches.items.length > 0
        ? `Same-day re-flight: ${rf.stretches.items.length} stretches of the version's own lines, taking again the ${rf.stretches.neededStations} planned photos that saw the lost ground (${rf.stretches.photos} photos in all); with the photos already taken, ${rf.stretches.coveredCells} of the ${rf.stretches.targetCells} lost cells worth re-flying then meet the whole spec.`
        : rf.lineCount > 0 ? `${rf.covers} Re-flight: ${rf.lineCount} lines, ${rf.photoCount} photos over ${rf.areas.length} areas.` : rf.covers,
    heights: d.heights.reference,
    map: d.map ?? null,
  };
}
