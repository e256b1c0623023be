/** Route /projects/:projectId/plans/:planId/versions/:versionId: a run's progress and results. */
import { lazyScreen } from '../../../../../../../components/app/lazy-screen';

export default lazyScreen(() => import('../../../../../../../components/app/office-screens').then((m) => m.VersionScreen));
