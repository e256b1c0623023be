/** The mail service factory for the boot sequence, and the typed way routes reach it. */
import { createVersionsRepository } from '../versions/versions.repository';
import { createReportService } from '../reports/reports.service';
import type { Db } from '../../db/client';
import type { Config } from '../config';
import type { Jobs } from '../jobs/jobs.service';
import type { Storage } from '../storage/storage';
import { createMailer, type Mailer, type ReportAttachment } from './mailer';
import { createTeamSettingsRepository } from '../teams/team-settings.repository';
import { createAsFlownRepository } from '../as-flown/as-flown.repository';

/** Start the mailer (and, with no SMTP_HOST, the fake SMTP server); its `close` stops both. */
export async function startMail(services: { db: Db; config: Config; storage: Storage; jobs: Pick<Jobs, 'boss'> }): Promise<Mailer> {
  const reports = createReportService({ versions: createVersionsRepository({ db: services.db }), storage: () => services.storage, asFlown: createAsFlownRepository({ db: services.db }), settings: createTeamSettingsRepository({ db: services.db }) });
  // The report is rendered when the mail is sent, from the version as it is then (a signed-off version is locked).
  const attachReport: ReportAttachment = async (ref) => {
    const v = await createVersionsRepository({ db: services.db }).find({ ...ref, role: 'owner' });
    if (!v) throw new Error(`version ${ref.versionId} no longer exists`);
    const { pdf, fileName } = await reports.pdfOf(v);
    return { filename: fileName, content: pdf, contentType: 'application/pdf' };
  };
  const mailer = await createMailer({ db: services.db, config: services.config, boss: services.jobs.boss, attachReport });
  if (services.config.env.NODE_ENV !== 'test') {
    const where =
      mailer.mode === 'fake'
        ? `the development outbox (fake SMTP on ${mailer.fake!.host}:${mailer.fake!.port}; owners read it at /api/teams/:teamId/dev/outbox)`
        : mailer.mode === 'smtp'
          ? `SMTP at ${services.config.env.SMTP_HOST}:${services.config.env.SMTP_PORT ?? 587}`
          : 'nowhere (DEV_OUTBOX=0 and no SMTP_HOST)';
    console.log(`loftline: mail goes to ${where}`);
  }
  return mailer;
}

/** A mailer that sends nothing, for a process that sends no mail (the worker script). */
export const noMail: Mailer = {
  mode: 'off',
  from: '',
  fake: null,
  enqueue: async () => undefined,
  idle: async () => undefined,
  close: async () => undefined,
};
