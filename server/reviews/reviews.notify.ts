/** The e-mails a review transition sends: review requested to the surveyors, signed off (PDF attached) or returned to the planner. */
import type { Notification, ReviewAction } from '../../contracts/reviews';
import type { Config } from '../config';
import type { SessionUser } from '../http/guard';
import type { Mailer } from '../mail/mailer';
import { links, returnedMail, reviewRequestedMail, signedOffMail, type VersionFacts } from '../mail/templates';
import type { ReviewsRepository } from './reviews.repository';
import type { VersionRecord } from './versions.repository';

/** Renders the compliance report PDF of a version (provided by the reports domain). */
export type RenderReportPdf = (version: VersionRecord) => Promise<{ pdf: Buffer; fileName: string }>;

export function createReviewNotifier(deps: { mailer: Mailer; reviews: ReviewsRepository; config: Config; renderReportPdf: RenderReportPdf }) {
  const { mailer, reviews, config } = deps;

  /** Queue the mail of one transition; answers at once with who will be told. */
  return async function notify(q: { action: ReviewAction; version: VersionRecord; actor: SessionUser; comment: string | null }): Promise<Notification> {
    const v = q.version;
    const facts = async (): Promise<VersionFacts> => ({
      teamName: await reviews.teamName(v.teamId),
      projectName: v.projectName,
      planName: v.planName,
      versionNumber: v.number,
      link: links.version(config.publicUrl, v.projectId, v.planId, v.id),
    });
    const ctx = { kind: `review.${q.action}`, teamId: v.teamId, planId: v.planId, versionId: v.id, actorId: q.actor.id };

    let recipients: string[];
    let build: () => Promise<ReturnType<typeof signedOffMail> | null>;
    if (q.action === 'submit') {
      recipients = (await reviews.membersWithRole(v.teamId, 'surveyor')).map((m) => m.email);
      if (recipients.length === 0) return { status: 'skipped', reason: 'The team has no surveyor to ask for a review.', recipients };
      build = async () => reviewRequestedMail({ ...(await facts()), to: recipients, submitterName: q.actor.name, comment: q.comment });
    } else {
      if (!v.createdByEmail) return { status: 'skipped', reason: 'The person who made this version no longer has an account.', recipients: [] };
      recipients = [v.createdByEmail];
      const to = v.createdByEmail;
      build =
        q.action === 'sign-off'
          ? async () => {
              const { pdf, fileName } = await deps.renderReportPdf(v);
              return signedOffMail({ ...(await facts()), to, signerName: q.actor.name, signedOffAt: v.signedOffAt ?? new Date(), comment: q.comment, pdf, pdfName: fileName });
            }
          : async () => returnedMail({ ...(await facts()), to, reviewerName: q.actor.name, comment: q.comment ?? '' });
    }
    mailer.enqueue(ctx, build);
    if (mailer.mode === 'off') return { status: 'skipped', reason: 'Mail is switched off on this server (no SMTP_HOST and DEV_OUTBOX=0).', recipients };
    return { status: 'queued', recipients };
  };
}

export type ReviewNotifier = ReturnType<typeof createReviewNotifier>;
