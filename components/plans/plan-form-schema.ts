/** The plan form: a name and the mission, checked by the very schema the API uses (contracts/mission.ts). */
import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldErrors, Resolver } from 'react-hook-form';
import { z } from 'zod';
import { missionSchema } from '../../contracts/mission';
import { MISSION_DEFAULTS } from '../../terrain/mission';
import { CAMERA_PRESETS, type Camera } from '../../terrain/camera';

const planFormSchema = z.object({
  name: z.string().trim().min(2, 'Name the plan (at least 2 characters).').max(120, 'Keep the plan name under 120 characters.'),
  mission: missionSchema,
});
export type PlanFormIn = z.input<typeof planFormSchema>;
export type PlanFormOut = z.output<typeof planFormSchema>;

/** The preset a new plan starts with (a 1-inch, 20 MP, 8.8 mm survey camera class). */
const defaultCamera: Camera = { ...CAMERA_PRESETS[1].camera };
/** Said under an emptied endurance field: the battery plan rests on it, so the form never fills it in unseen. */
export const emptyEnduranceMessage = 'Enter the endurance per battery in minutes: the battery plan on the leg sheet is built from it.';

const schemaResolver = zodResolver(planFormSchema);

/**
 * The mission schema, plus one rule of the form's own: the API fills an absent endurance with its default, but a
 * field the planner emptied is refused with a message instead of being replaced silently.
 */
export const planFormResolver: Resolver<PlanFormIn, unknown, PlanFormOut> = async (values, context, options) => {
  const result = await schemaResolver(values, context, options);
  if (values.mission?.enduranceMin !== undefined) return result;
  const errors = (result.errors ?? {}) as FieldErrors<PlanFormIn>;
  const mission = { ...(errors.mission ?? {}), enduranceMin: { type: 'required', message: emptyEnduranceMessage } };
  return { values: {}, errors: { ...errors, mission } as FieldErrors<PlanFormIn> };
};

/** A new plan's target GSD: 3 cm is a common survey figure (common practice). */
const defaultTargetGsdCm = 3;

/** Form values of a new plan, or of a saved one (its input laid over the defaults). */
export function planFormDefaults(name: string, saved?: Record<string, unknown> | null): PlanFormIn {
  const base = { ...MISSION_DEFAULTS, camera: defaultCamera, targetGsdCm: defaultTargetGsdCm } as Record<string, unknown>;
  return { name, mission: { ...base, ...(saved ?? {}) } as PlanFormIn['mission'] };
}

/** The form path of a field the server named ("input.targetGsdCm", "mission.camera.focalLengthMm", "name"). */
export function formPathOf(serverPath: string): string {
  if (serverPath === 'name') return 'name';
  const rest = serverPath.replace(/^(input|mission)\./, '');
  return rest === '(body)' ? 'root' : `mission.${rest}`;
}

/** Field messages name the field in code ("targetGsdCm must be …"); beside a labelled field "Must be …" reads better. */
export function fieldMessage(message: string | undefined): string | undefined {
  if (!message) return message;
  return message.replace(/^[a-zA-Z]+(\.[a-zA-Z]+)* must\b/, 'Must');
}
