/**
 * Re-flight plans from an as-flown check: each re-flight area's mission (same camera, overlaps, mode, limits and
 * takeoff as the version, lines on the version's own positions) saved as a new plan of the same project over the
 * same grid, named after the version it mends, so the planner runs it, the surveyor signs it off and the crew flies
 * it the same day.
 */
import { useState } from 'react';
import type { AsFlownCheck } from '../../contracts/as-flown';
import { can } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { useCreatePlan } from '../plans/plans.queries';
import { useCurrentTeam } from '../team/current-team-context';

/** The version the check belongs to, as the version screen knows it. */
export interface ReflightOrigin {
  projectId: string;
  siteId: string;
  planName: string;
  versionNumber: number;
}

type ReflightPlans =
  | { kind: 'idle' }
  | { kind: 'saving'; done: number; total: number }
  | { kind: 'saved'; plans: Array<{ id: string; name: string; href: string }> }
  | { kind: 'failed'; message: string };

/** "Re-flight 2 of 4 for Face and heap v3 (check of 3 Dec 2026)". */
function reflightPlanName(origin: ReflightOrigin, k: number, total: number, checkedOn: string): string {
  return `Re-flight ${k + 1} of ${total} for ${origin.planName} v${origin.versionNumber} (photos checked ${checkedOn})`.slice(0, 200);
}

export function useReflightPlans(origin: ReflightOrigin | undefined) {
  const { team, role } = useCurrentTeam();
  const create = useCreatePlan(team?.id ?? '', origin?.projectId ?? '');
  const [state, setState] = useState<ReflightPlans>({ kind: 'idle' });

  async function save(check: AsFlownCheck, checkedOn: string) {
    const missions = check.document.reflight?.missions ?? [];
    if (!origin || missions.length === 0) return;
    const plans: Array<{ id: string; name: string; href: string }> = [];
    try {
      for (let k = 0; k < missions.length; k++) {
        setState({ kind: 'saving', done: k, total: missions.length });
        const name = reflightPlanName(origin, k, missions.length, checkedOn);
        const plan = await create.mutateAsync({ name, siteId: origin.siteId, input: missions[k] as Record<string, unknown> });
        plans.push({ id: plan.id, name: plan.name, href: `/projects/${origin.projectId}/plans/${plan.id}` });
      }
      setState({ kind: 'saved', plans });
    } catch (err) {
      setState({ kind: 'failed', message: `${plans.length ? `${plans.length} of ${missions.length} re-flight plans were saved before this: ` : ''}${errorMessage(err)}` });
    }
  }

  return { mayMake: Boolean(origin) && can(role, 'plan:write'), state, save: (check: AsFlownCheck, checkedOn: string) => void save(check, checkedOn) };
}
