/** Reports of plan versions: the JSON report and its PDF, for one version the caller may see. */
import type { ComplianceReport } from '../../contracts/reports';
import type { Role } from '../../contracts/roles';
import { errors } from '../http/errors';
import type { VersionRecord, VersionsRepository } from '../versions/versions.repository';
import { buildReport } from './report.build';
import { reportAsFlown } from './report.as-flown';
import { reportFlown } from './report.flown';
import type { AsFlownCheck } from '../../contracts/as-flown';
import { renderReportPdf, reportFileName } from './report.pdf';
import { requireAnalysed } from '../versions/result-view';
import { coverageKeys } from '../coverage/coverage-keys';
import { StorageNotFoundError, type Storage } from '../storage/storage';

/** The as-flown checks a report reads (server/as-flown/as-flown.repository.ts). */
interface AsFlownSource {
  latest(teamId: string, versionId: string): Promise<{ check: AsFlownCheck | null; count: number }>;
}

/** The team's rules the report states (whether a confirmation as flown is required). */
interface TeamRulesSource {
  get(teamId: string): Promise<{ requireFlownConfirmation: boolean }>;
}

export function createReportService(deps: { versions: VersionsRepository; now?: () => Date; storage?: () => Storage; asFlown?: AsFlownSource; settings?: TeamRulesSource }) {
  const now = deps.now ?? (() => new Date());

  /** The printed coverage map of a version with a ready coverage run (null without one). */
  async function coverageMap(v: VersionRecord): Promise<Buffer | null> {
    if (!deps.storage || (v.coverage as { state?: string } | null)?.state !== 'ready') return null;
    try {
      return await deps.storage().getBytes(coverageKeys.print(v.teamId, v.id));
    } catch (err) {
      if (err instanceof StorageNotFoundError) return null; // versions stored before the printed map existed
      throw err;
    }
  }

  /** The report's as-flown section: the latest check of the version's photos (null without the source or a check). */
  async function asFlownOf(v: VersionRecord) {
    const { check, count } = deps.asFlown ? await deps.asFlown.latest(v.teamId, v.id) : { check: null, count: 0 };
    const required = deps.settings ? (await deps.settings.get(v.teamId)).requireFlownConfirmation : false;
    return { asFlown: deps.asFlown ? reportAsFlown(check, count) : null, flown: reportFlown(v, required, check) };
  }

  async function load(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<VersionRecord> {
    const v = await deps.versions.find(q);
    if (!v) throw errors.not_found('Plan version');
    requireAnalysed(v);
    return v;
  }

  /** The PDF of a version the caller already holds (used by the sign-off e-mail). */
  async function pdfOf(v: VersionRecord): Promise<{ pdf: Buffer; fileName: string; report: ComplianceReport }> {
    requireAnalysed(v);
    const report = buildReport(v, now(), await asFlownOf(v));
    return { pdf: await renderReportPdf(report, { coverageMap: await coverageMap(v) }), fileName: reportFileName(report), report };
  }

  return {
    /** The report of a version (409 until its analysis is done). */
    async report(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<ComplianceReport> {
      const v = await load(q);
      return buildReport(v, now(), await asFlownOf(v));
    },
    pdfOf,
    /** The PDF of a version the caller may see. */
    pdf: async (q: { teamId: string; planId: string; versionId: string; role: Role }) => pdfOf(await load(q)),
  };
}
