/** Route /projects/:projectId/plans/:planId/versions/:versionId/report: the version's compliance report. */
import { ReportScreen } from '../../../../../../../../components/reports/report-screen';

export default ReportScreen;
