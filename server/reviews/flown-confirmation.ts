/**
 * Confirming a signed-off version as flown: a surveyor (or owner) looks at the latest check of its photos and
 * confirms it, giving a reason for each spec item the flight lost against the plan. Kept on the version with who,
 * when and which check, and in the audit trail. Where the team's rule requires it, the report says the version's
 * review is complete only once this is done.
 */
import type { AsFlownCheck } from '../../contracts/as-flown';
import { itemTitle } from '../../contracts/coverage-words';
import type { FlownConfirmation, FlownShortfall } from '../../contracts/flown-confirmation';
import type { SignOffReason } from '../../contracts/reviews';
import { can, type Role } from '../../contracts/roles';
import type { Db } from '../../db/client';
import { auditEvent, flownConfirmation } from '../../db/schema';
import { errors } from '../http/errors';
import { versionErrors } from '../versions/versions.errors';
import { reviewErrors } from './reviews.errors';
import type { TeamSettingsRepository } from '../teams/team-settings.repository';
import type { VersionRecord, VersionsRepository } from '../versions/versions.repository';

type Checks = { latest(teamId: string, versionId: string): Promise<{ check: AsFlownCheck | null; count: number }>; find(teamId: string, versionId: string, checkId: string): Promise<AsFlownCheck | null> };

/** A share is lost when the flight's is below the plan's by more than rounding (shares are stored to 1e-6). */
const LOST_BY = 1e-6;

/** The spec items a check shows lost against the plan, worded as the check card words them. */
function shortfallsOf(check: AsFlownCheck): FlownShortfall[] {
  const d = check.document;
  return d.flown.items
    .map((it) => ({ key: it.item, label: itemTitle(it.item, d.spec), planned: d.planned.items.find((p) => p.item === it.item)?.share ?? 0, flown: it.share }))
    .filter((s) => s.flown < s.planned - LOST_BY);
}

const pct = (share: number) => `${(Math.floor(share * 1000) / 10).toFixed(1)} %`;

export function createFlownConfirmation(deps: { db: Db; versions: VersionsRepository; checks: Checks; settings: TeamSettingsRepository }) {
  const { db, versions, checks, settings } = deps;

  async function load(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<VersionRecord> {
    const v = await versions.find(q);
    if (!v) throw errors.not_found('Plan version');
    return v;
  }

  async function statusOf(v: VersionRecord, role: Role): Promise<FlownConfirmation> {
    const { requireFlownConfirmation: required } = await settings.get(v.teamId);
    const confirmed = v.flownConfirmedAt !== null;
    const check = confirmed && v.flownCheckId ? await checks.find(v.teamId, v.id, v.flownCheckId) : (await checks.latest(v.teamId, v.id)).check;
    const shortfalls = check ? shortfallsOf(check) : [];
    const blockedBecause = confirmed
      ? 'Already confirmed as flown.'
      : v.reviewState !== 'signed_off'
        ? 'Only a signed-off version can be confirmed as flown.'
        : !check
          ? 'No photos of this version have been checked yet: check the flight\'s photos (Photos as flown) first.'
          : !can(role, 'plan:review')
            ? 'Only a surveyor or an owner confirms a version as flown.'
            : null;
    return {
      required,
      confirmedBy: v.flownConfirmedById ? { id: v.flownConfirmedById, name: v.flownConfirmedByName ?? '(former member)' } : null,
      confirmedAt: v.flownConfirmedAt ? v.flownConfirmedAt.toISOString() : null,
      check: check ? { id: check.id, label: check.label, photoCount: check.photoCount, checkedAt: check.createdAt, shareAllFlown: check.document.flown.shareAll, shareAllPlanned: check.document.planned.shareAll } : null,
      shortfalls,
      reasons: (v.flownReasons ?? []).map((r) => ({ ...r, label: shortfalls.find((s) => s.key === r.key)?.label ?? r.key })),
      mayConfirm: blockedBecause === null,
      blockedBecause,
    };
  }

  return {
    async status(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<FlownConfirmation> {
      return statusOf(await load(q), q.role);
    },

    /** Confirm as flown against the latest check; 409 when it cannot be yet, 422 naming each lost item without a reason. */
    async confirm(q: { teamId: string; planId: string; versionId: string; role: Role; actorId: string; comment: string | null; reasons: SignOffReason[] }): Promise<FlownConfirmation> {
      const v = await load(q);
      const status = await statusOf(v, q.role);
      if (!status.mayConfirm || !status.check) {
        const message = `Version ${v.number} cannot be confirmed as flown: ${status.blockedBecause}`;
        throw v.flownConfirmedAt ? reviewErrors.already_confirmed(message) : v.reviewState !== 'signed_off' ? versionErrors.not_signed_off(message) : reviewErrors.as_flown_required(message);
      }
      const missing = status.shortfalls.filter((s) => !q.reasons.some((r) => r.key === s.key && r.reason.trim().length > 0));
      if (missing.length) {
        throw reviewErrors.reasons_required(
          `The latest check of the photos (${status.check.label}) shows the flight lost ground against the plan on ${missing.length === 1 ? 'one item' : `${missing.length} items`} (${missing
            .map((m) => `${m.label}: ${pct(m.flown)} of the area as flown, ${pct(m.planned)} as planned`)
            .join('; ')}). Give a reason for confirming despite each (e.g. re-flown and checked again), or re-fly and check the photos again.`,
          missing.map((m) => ({ path: `reasons.${m.key}`, message: `Say why the version may be confirmed as flown although "${m.label}" fell from ${pct(m.planned)} to ${pct(m.flown)} of the area.` })),
        );
      }
      const reasons = status.shortfalls.map((s) => q.reasons.find((r) => r.key === s.key)!).map(({ key, reason }) => ({ key, reason }));
      const checkId = status.check.id;
      const done = await db.transaction(async (tx) => {
        // once per version: the key keeps two surveyors confirming at the same moment from both writing
        const rows = await tx
          .insert(flownConfirmation)
          .values({ planVersionId: v.id, teamId: q.teamId, checkId, confirmedBy: q.actorId, reasons: reasons.length ? reasons : null })
          .onConflictDoNothing()
          .returning({ id: flownConfirmation.planVersionId });
        if (rows.length === 0) return false;
        await tx.insert(auditEvent).values({
          teamId: q.teamId, planId: v.planId, planVersionId: v.id, actorId: q.actorId, action: 'review.flown_confirmed',
          fromState: 'signed_off', toState: 'signed_off',
          comment: [`Against the check "${status.check!.label}" (${status.check!.photoCount} photos).`, q.comment].filter(Boolean).join(' '),
        });
        return true;
      });
      if (!done) throw reviewErrors.already_confirmed(`Version ${v.number} was confirmed as flown a moment ago by someone else.`);
      return statusOf(await load(q), q.role);
    },
  };
}
