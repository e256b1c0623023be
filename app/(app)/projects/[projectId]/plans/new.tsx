/** Route /projects/:projectId/plans/new (?siteId=). */
import { lazyScreen } from '../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.NewPlanScreen);
