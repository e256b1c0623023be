/** The compliance report of one plan version (JSON for the screen) and the address of its PDF. */
import { useQuery } from '@tanstack/react-query';
import { complianceReportSchema } from '../../contracts/reports';
import { apiFetch } from '../api/api-fetch';
import { versionApiPath } from '../reviews/reviews.queries';

/** Query keys for reports, per team. */
const reportKeys = {
  all: ['reports'] as const,
  team: (teamId: string) => [...reportKeys.all, teamId] as const,
  report: (teamId: string, planId: string, versionId: string) => [...reportKeys.team(teamId), planId, versionId] as const,
};

/** Same-origin address of the PDF; the browser downloads it with the session cookie. */
export const reportPdfPath = (teamId: string, planId: string, versionId: string) => `${versionApiPath(teamId, planId, versionId)}/report.pdf`;

/** The report of an analysed version (report:read; the server answers 409 while the analysis is not done). */
export function useComplianceReport(teamId: string | undefined, planId: string | undefined, versionId: string | undefined) {
  return useQuery({
    queryKey: reportKeys.report(teamId ?? '', planId ?? '', versionId ?? ''),
    queryFn: ({ signal }) => apiFetch(`${versionApiPath(teamId!, planId!, versionId!)}/report`, { schema: complianceReportSchema, signal }),
    enabled: Boolean(teamId && planId && versionId),
  });
}
