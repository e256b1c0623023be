/** Shapes of plans (what to fly over a site), their immutable versions and analysis runs. */
import { resultOverviewSchema } from './result-parts';
import { z } from 'zod';
import { userText } from './text';
import { missionSchema, storedMissionSchema } from './mission';
import { planResultSchema } from './plan-result';
import { reviewStateSchema } from './reviews';

const planName = userText().trim().min(1, 'Give the plan a name.').max(120, 'Keep the plan name under 120 characters.');

/** POST /teams/:teamId/projects/:projectId/plans: a name, the site to fly over and the mission. */
export const createPlanSchema = z.object({
  name: planName,
  siteId: z.string({ error: 'Choose the elevation grid (site) to plan over.' }).uuid('Choose the elevation grid (site) to plan over.'),
  input: missionSchema,
});
export type CreatePlan = z.input<typeof createPlanSchema>;

/** PATCH /teams/:teamId/plans/:planId: any of the three; `input` replaces the whole mission. */
export const updatePlanSchema = z
  .object({
    name: planName.optional(),
    siteId: z.string().uuid('Choose the elevation grid (site) to plan over.').optional(),
    input: missionSchema.optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Send at least one field to change.' });
export type UpdatePlan = z.input<typeof updatePlanSchema>;

const analysisStates = ['queued', 'running', 'done', 'failed'] as const;
/** Where a version's analysis stands: queued -> running -> done | failed. */
export const analysisStateSchema = z.enum(analysisStates);
export type AnalysisState = z.infer<typeof analysisStateSchema>;

/** Our labels for the analysis states. */
export const analysisStateLabels: Record<AnalysisState, string> = {
  queued: 'Waiting for a worker',
  running: 'Analysing',
  done: 'Analysed',
  failed: 'Analysis failed',
};

/** Polling answer: GET /teams/:teamId/plans/:planId/versions/:versionId/status. */
export const versionStatusSchema = z.object({
  id: z.string().uuid(),
  planId: z.string().uuid(),
  number: z.number().int(),
  analysisState: analysisStateSchema,
  analysisProgressPct: z.number().int().min(0).max(100),
  /** Why the analysis failed (or, while queued again, why the last attempt stopped). */
  analysisError: z.string().nullable(),
  analysedAt: z.string().nullable(),
});
export type VersionStatus = z.infer<typeof versionStatusSchema>;

/** A version in lists: its state without the input and result. */
export const versionSummarySchema = versionStatusSchema.extend({
  siteId: z.string().uuid(),
  reviewState: reviewStateSchema,
  createdAt: z.string(),
  createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

/** One version with the mission it snapshotted and, once done, the analysis result. */
export const planVersionSchema = versionSummarySchema.extend({
  input: storedMissionSchema,
  result: planResultSchema.nullable(),
});
export type PlanVersion = z.infer<typeof planVersionSchema>;

/** One version with its result's overview in place of the whole result (`?part=overview`; stations per line on demand). */
export const planVersionOverviewSchema = versionSummarySchema.extend({
  input: storedMissionSchema,
  result: resultOverviewSchema.nullable(),
});

export const versionListSchema = z.object({ versions: z.array(versionSummarySchema) });

export const planSchema = z.object({
  id: z.string().uuid(),
  teamId: z.string(),
  projectId: z.string().uuid(),
  siteId: z.string().uuid(),
  name: z.string(),
  /** The mission as last saved, with every default filled in (checked when saved, not again on each read). */
  input: storedMissionSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  versionCount: z.number().int(),
  latestVersion: versionSummarySchema.nullable(),
});
export type Plan = z.infer<typeof planSchema>;

export const planListSchema = z.object({ plans: z.array(planSchema) });

/** Body of POST /teams/:teamId/plans/:planId/runs (nothing needed: the saved plan is what runs). */
export const runPlanSchema = z.object({}).strict();
