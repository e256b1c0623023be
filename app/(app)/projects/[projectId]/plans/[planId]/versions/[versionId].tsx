/** Route /projects/:projectId/plans/:planId/versions/:versionId: a run's progress and results. */
import { lazyScreen } from '../../../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.VersionScreen);
