/** The e-mails a review transition sends: review requested to the surveyors, signed off (PDF attached) or returned to the planner. */
import type { Notification, ReviewAction } from '../../contracts/reviews';
import type { Config } from '../config';
import type { SessionUser } from '../http/guard';
import type { MailJob, Mailer } from '../mail/mailer';
import { links, returnedMail, reviewRequestedMail, signedOffMail, type VersionFacts } from '../mail/templates';
import { reportFileName } from '../reports/report.pdf';
import type { ReviewsRepository } from './reviews.repository';
import type { VersionRecord } from '../versions/versions.repository';

/** A transition's mail, prepared before the change: the job (given the transition's time) and what to tell the caller. */
interface PreparedNotification {
  notification: Notification;
  /** The queue job, made inside the transaction once its time is known; null when nobody is to be told. */
  job: ((at: Date) => MailJob) | null;
}

export function createReviewNotifier(deps: { mailer: Mailer; reviews: ReviewsRepository; config: Config }) {
  const { mailer, reviews, config } = deps;

  /** Who will be told of this transition and with what mail (sent through the queue by the caller's transaction). */
  return async function prepare(q: { action: ReviewAction; version: VersionRecord; actor: SessionUser; comment: string | null }): Promise<PreparedNotification> {
    const v = q.version;
    const facts: VersionFacts = {
      teamName: await reviews.teamName(v.teamId),
      projectName: v.projectName,
      planName: v.planName,
      versionNumber: v.number,
      link: links.version(config.publicUrl, v.projectId, v.planId, v.id),
    };
    const ctx = { kind: `review.${q.action}`, teamId: v.teamId, planId: v.planId, versionId: v.id, actorId: q.actor.id };

    let recipients: string[];
    let job: (at: Date) => MailJob;
    if (q.action === 'submit') {
      recipients = (await reviews.membersWithRole(v.teamId, 'surveyor')).map((m) => m.email);
      if (recipients.length === 0) return { notification: { status: 'skipped', reason: 'The team has no surveyor to ask for a review.', recipients }, job: null };
      job = () => ({ ctx, mail: reviewRequestedMail({ ...facts, to: recipients, submitterName: q.actor.name, comment: q.comment }) });
    } else {
      if (!v.createdByEmail) return { notification: { status: 'skipped', reason: 'The person who made this version no longer has an account.', recipients: [] }, job: null };
      recipients = [v.createdByEmail];
      const to = v.createdByEmail;
      job =
        q.action === 'sign-off'
          ? (at) => ({
              ctx,
              mail: signedOffMail({ ...facts, to, signerName: q.actor.name, signedOffAt: at, comment: q.comment, pdfName: reportFileName({ plan: { name: v.planName }, version: { number: v.number } } as Parameters<typeof reportFileName>[0]) }),
              attachReportOf: { teamId: v.teamId, versionId: v.id },
            })
          : () => ({ ctx, mail: returnedMail({ ...facts, to, reviewerName: q.actor.name, comment: q.comment ?? '' }) });
    }
    if (mailer.mode === 'off') return { notification: { status: 'skipped', reason: 'Mail is switched off on this server (no SMTP_HOST and DEV_OUTBOX=0).', recipients }, job };
    return { notification: { status: 'queued', recipients }, job };
  };
}

export type ReviewNotifier = ReturnType<typeof createReviewNotifier>;
