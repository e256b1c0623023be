/** Speed per leg (as fast as the mission's speed and the climb/descent limits allow on its gradient) and the flight time it gives. */
import type { Mission } from './mission';
import type { PlanResult } from './plan-result';

/** Fastest ground speed at which a leg of `gradient` (rise over run) stays within the vertical-speed limits. */
export function legSpeedMps(m: Pick<Mission, 'speedMps' | 'climbMps' | 'descentMps'>, gradient: number): number {
  if (gradient > 1e-12) return Math.min(m.speedMps, m.climbMps / gradient);
  if (gradient < -1e-12) return Math.min(m.speedMps, m.descentMps / -gradient);
  return m.speedMps;
}

/**
 * Flight time of a plan whose legs fly at their own speeds: the plan's estimate (everything at the mission's
 * speed) plus, per leg, the extra time its slower speed takes.
 */
export function flightTimeWithLegSpeedsS(plan: PlanResult, m: Mission): number {
  let extra = 0;
  for (const l of plan.lines) for (const g of l.legs) {
    const len = g.end.distanceM - g.start.distanceM;
    const v = g.speedMps ?? m.speedMps;
    extra += len / v - len / m.speedMps;
  }
  return plan.summary.flightTimeS + extra;
}
