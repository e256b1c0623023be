/** The report screen's data: route ids, the current team, and the report query. */
import { useLocalSearchParams } from 'expo-router';
import { useCurrentTeam } from '../team/current-team-context';
import { reportPdfPath, useComplianceReport } from './reports.queries';

/** Ids come from /projects/:projectId/plans/:planId/versions/:versionId/report. */
export function useReportScreen() {
  const { projectId, planId, versionId } = useLocalSearchParams<{ projectId: string; planId: string; versionId: string }>();
  const { team } = useCurrentTeam();
  const report = useComplianceReport(team?.id, planId, versionId);
  return {
    projectId,
    planId,
    versionId,
    report,
    versionHref: `/projects/${projectId}/plans/${planId}/versions/${versionId}`,
    pdfHref: team && planId && versionId ? reportPdfPath(team.id, planId, versionId) : null,
  };
}
