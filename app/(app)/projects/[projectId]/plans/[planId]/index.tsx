/** Route /projects/:projectId/plans/:planId. */
import { lazyScreen } from '../../../../../../components/app/lazy-screen';

export default lazyScreen(() => import('../../../../../../components/app/office-screens').then((m) => m.PlanScreen));
