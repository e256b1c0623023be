/** Reports of plan versions: the JSON report and its PDF, for one version the caller may see. */
import type { ComplianceReport } from '../../contracts/reports';
import type { Role } from '../../contracts/roles';
import { errors } from '../http/errors';
import type { VersionRecord, VersionsRepository } from '../reviews/versions.repository';
import { buildReport } from './report.build';
import { renderReportPdf, reportFileName } from './report.pdf';
import { requireAnalysed } from './result-view';

export function createReportService(deps: { versions: VersionsRepository; now?: () => Date }) {
  const now = deps.now ?? (() => new Date());

  async function load(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<VersionRecord> {
    const v = await deps.versions.find(q);
    if (!v) throw errors.notFound('Plan version');
    requireAnalysed(v);
    return v;
  }

  /** The PDF of a version the caller already holds (used by the sign-off e-mail). */
  async function pdfOf(v: VersionRecord): Promise<{ pdf: Buffer; fileName: string; report: ComplianceReport }> {
    requireAnalysed(v);
    const report = buildReport(v, now());
    return { pdf: await renderReportPdf(report), fileName: reportFileName(report), report };
  }

  return {
    /** The report of a version (409 until its analysis is done). */
    async report(q: { teamId: string; planId: string; versionId: string; role: Role }): Promise<ComplianceReport> {
      return buildReport(await load(q), now());
    },
    pdfOf,
    /** The PDF of a version the caller may see. */
    pdf: async (q: { teamId: string; planId: string; versionId: string; role: Role }) => pdfOf(await load(q)),
  };
}

export type ReportService = ReturnType<typeof createReportService>;
