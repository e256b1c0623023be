/** A work item in words: where its row leads, its state badge and the line saying who moved it there and when. */
import { reviewStateLabels } from '../../contracts/reviews';
import { workKindWords, type WorkItem, type WorkKind, type WorkSection } from '../../contracts/work';
import { formatDay } from '../projects/format-date';
import { reviewStateTones } from '../reviews/review-state';
import type { BadgeTone } from '../ui/badge';

export type WorkRow = {
  key: string;
  href: string;
  title: string;
  project: string;
  state: { label: string; tone: BadgeTone };
  /** "Sent for review by … on …", "Returned by … on …", "Signed off by … on …", "Analysed … on …". */
  history: string;
  /** The surveyor's comment on a returned version, quoted. */
  comment: string | null;
};

const verbs: Record<WorkKind, string> = {
  review: 'Sent for review',
  returned: 'Returned',
  send: 'Run',
  flight: 'Signed off',
};

/** Flights open the leg sheet; everything else opens the version's screen (results, report, review panel). */
function hrefOf(kind: WorkKind, item: WorkItem): string {
  if (kind === 'flight') return `/flights/${item.versionId}`;
  return `/projects/${item.projectId}/plans/${item.planId}/versions/${item.versionId}`;
}

function workRowOf(kind: WorkKind, item: WorkItem): WorkRow {
  return {
    key: item.versionId,
    href: hrefOf(kind, item),
    title: `${item.planName} · version ${item.number}`,
    project: item.client ? `${item.projectName} for ${item.client}` : item.projectName,
    state: { label: reviewStateLabels[item.reviewState], tone: reviewStateTones[item.reviewState] },
    history: `${verbs[kind]}${item.by ? ` by ${item.by}` : ''} on ${formatDay(item.since)}`,
    comment: item.comment,
  };
}

export type WorkSectionView = { kind: WorkKind; title: string; note: string; empty: string; rows: WorkRow[] };

/** The sections as the screen shows them, in the order the server sent (the role's order). */
export function workSectionsView(sections: readonly WorkSection[]): WorkSectionView[] {
  return sections.map((s) => ({ kind: s.kind, ...workKindWords[s.kind], rows: s.items.map((i) => workRowOf(s.kind, i)) }));
}
