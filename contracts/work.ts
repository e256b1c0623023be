/** The work list: what waits for the signed-in person in their team, by role, with each version's review state. */
import { z } from 'zod';
import { analysisStateSchema } from './plans';
import { reviewStateSchema } from './reviews';
import type { Role } from './roles';

/**
 * Kinds of waiting work, each a list of its own: versions in review (surveyors sign them off or return them),
 * versions returned with comments and analysed drafts not yet sent (planners), signed-off versions (pilots fly them).
 */
const workKinds = ['review', 'returned', 'send', 'flight'] as const;
const workKindSchema = z.enum(workKinds);
export type WorkKind = z.infer<typeof workKindSchema>;

/** Which lists each role's home shows, in order: the first is the one that role acts on most. */
export const workKindsByRole: Record<Role, readonly WorkKind[]> = {
  owner: ['review', 'returned', 'send', 'flight'],
  planner: ['returned', 'send'],
  surveyor: ['review'],
  pilot: ['flight'],
};

/** Titles and the line under them, our own wording. */
export const workKindWords: Record<WorkKind, { title: string; empty: string; note: string }> = {
  review: {
    title: 'Waiting for your review',
    empty: 'No version is waiting for review.',
    note: 'Versions a planner sent for review: open one to read its compliance report, then sign it off or return it with comments.',
  },
  returned: {
    title: 'Returned to the planner',
    empty: 'No version is waiting with comments.',
    note: 'A surveyor returned these with comments: change the plan and run it again, or answer and send the version again.',
  },
  send: {
    title: 'Analysed, not yet sent for review',
    empty: 'No analysed draft is waiting to be sent.',
    note: 'The latest version of each of these plans is analysed: check the results, then send it for review.',
  },
  flight: {
    title: 'Signed off, ready to fly',
    empty: 'No signed-off version yet. A version reaches this list once a surveyor signs it off.',
    note: 'Open one for its leg sheet: altitudes above takeoff per leg, the battery plan and the pre-flight checklist.',
  },
};

/** One version waiting in a list. */
const workItemSchema = z.object({
  versionId: z.string(),
  planId: z.string(),
  projectId: z.string(),
  number: z.number().int(),
  planName: z.string(),
  projectName: z.string(),
  client: z.string(),
  reviewState: reviewStateSchema,
  analysisState: analysisStateSchema,
  /** When the version reached its state (sent, returned, signed off; for a draft: analysed). */
  since: z.string(),
  /** Who moved it there (sender, returner, signer; for a draft: who ran it), or null when unknown. */
  by: z.string().nullable(),
  /** The surveyor's comment on a returned version, else null. */
  comment: z.string().nullable(),
});
export type WorkItem = z.infer<typeof workItemSchema>;

const workSectionSchema = z.object({ kind: workKindSchema, items: z.array(workItemSchema) });
export type WorkSection = z.infer<typeof workSectionSchema>;

/** Answer of GET /teams/:teamId/work: the caller's role and its lists, in `workKindsByRole` order. */
export const workListSchema = z.object({ sections: z.array(workSectionSchema) });
export type WorkList = z.infer<typeof workListSchema>;
