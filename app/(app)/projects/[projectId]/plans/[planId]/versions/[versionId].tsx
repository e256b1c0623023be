/** Route /projects/:projectId/plans/:planId/versions/:versionId: a run's progress and results. */
import { VersionScreen } from '../../../../../../../components/results/version-screen';

export default VersionScreen;
