/**
 * The texts of Loftline's e-mails: pure functions from the facts to subject and plain-text body. Mail is plain text
 * only (no HTML part), so names need no markup escaping; they pass through plainText (no bidi overrides or control
 * characters) and the subject is one line, so a name cannot add a header or reorder the text around it.
 */
import { generalCautions } from '../../contracts/cautions';
import { roleLabels, roleSummaries, type Role } from '../../contracts/roles';
import { plainText } from '../../contracts/text';
import type { OutgoingMail } from './mailer';

/** The finished message with its texts cleaned: nodemailer encodes headers, this keeps the subject to one line. */
function clean(m: OutgoingMail): OutgoingMail {
  return { ...m, subject: plainText(m.subject).replace(/[\r\n\t]+/g, ' '), text: plainText(m.text) };
}

/** Links into the web app that e-mails carry. */
export const links = {
  invitation: (publicUrl: string, token: string) => `${publicUrl}/invite/${encodeURIComponent(token)}`,
  version: (publicUrl: string, projectId: string, planId: string, versionId: string) => `${publicUrl}/projects/${projectId}/plans/${planId}/versions/${versionId}`,
  legSheet: (publicUrl: string, versionId: string) => `${publicUrl}/flights/${versionId}`,
  flights: (publicUrl: string) => `${publicUrl}/flights`,
};

/** What every review mail names: which version of which plan. */
export interface VersionFacts {
  teamName: string;
  projectName: string;
  planName: string;
  versionNumber: number;
  link: string;
}

const signature = '\n\n-- \nSent by Loftline for your team. You get this because of your role in the team.';

function versionLine(v: VersionFacts): string {
  return `${v.planName}, version ${v.versionNumber} (project ${v.projectName}, team ${v.teamName})`;
}

/** Invitation to join a team with a role. */
export function invitationMail(f: { to: string; teamName: string; inviterName: string; role: Role; link: string; expiresAt: Date }): OutgoingMail {
  return clean({
    to: [f.to],
    subject: `${f.inviterName} invites you to ${f.teamName} on Loftline`,
    text:
      `${f.inviterName} invites you to join the team ${f.teamName} on Loftline as ${roleLabels[f.role]}.\n` +
      `${roleLabels[f.role]}: ${roleSummaries[f.role]}\n\n` +
      `Open this link to sign in (or create an account with this address, ${f.to}) and join:\n${f.link}\n\n` +
      `The invitation works once, only for ${f.to}, and expires on ${f.expiresAt.toUTCString()}.` +
      signature,
  });
}

/** To the team's surveyors: a planner sent a version for review. */
export function reviewRequestedMail(f: VersionFacts & { to: string[]; submitterName: string; comment?: string | null }): OutgoingMail {
  return clean({
    to: f.to,
    subject: `Review requested: ${f.planName} v${f.versionNumber}`,
    text:
      `${f.submitterName} sent ${versionLine(f)} for review.\n` +
      (f.comment ? `\nTheir note:\n${f.comment}\n` : '') +
      `\nCheck the compliance report and sign the version off or return it with comments:\n${f.link}` +
      signature,
  });
}

/** To the planner who made the version: signed off, with the compliance report attached. */
export function signedOffMail(
  f: VersionFacts & { to: string; signerName: string; signedOffAt: Date; comment?: string | null; pdfName: string },
): OutgoingMail {
  return clean({
    to: [f.to],
    subject: `Signed off: ${f.planName} v${f.versionNumber}`,
    text:
      `${f.signerName} signed off ${versionLine(f)} on ${f.signedOffAt.toUTCString()}.\n` +
      (f.comment ? `\nTheir note:\n${f.comment}\n` : '') +
      `\nThe compliance report is attached (${f.pdfName}). The version is now locked and visible to the team's pilots; ` +
      `a change to the plan makes a new version that needs its own review.\n${f.link}\n\n` +
      `Before anyone flies it:\n${generalCautions.map((c) => `- ${c}`).join('\n')}` +
      signature,
  });
}

/** To the planner who made the version: returned, with the surveyor's comment. */
export function returnedMail(f: VersionFacts & { to: string; reviewerName: string; comment: string }): OutgoingMail {
  return clean({
    to: [f.to],
    subject: `Returned with comments: ${f.planName} v${f.versionNumber}`,
    text:
      `${f.reviewerName} returned ${versionLine(f)} with these comments:\n\n${f.comment}\n\n` +
      `Change the plan and run it again, or send this version back for review once the comments are answered:\n${f.link}` +
      signature,
  });
}
