/** Route /projects/:projectId/plans/:planId/versions/:versionId/report: the version's compliance report. */
import { lazyScreen } from '../../../../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.ReportScreen);
