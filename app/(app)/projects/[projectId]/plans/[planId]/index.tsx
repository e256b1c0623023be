/** Route /projects/:projectId/plans/:planId. */
import { lazyScreen } from '../../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.PlanScreen);
