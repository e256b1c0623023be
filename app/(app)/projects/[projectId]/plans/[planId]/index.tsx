/** Route /projects/:projectId/plans/:planId. */
import { PlanScreen } from '../../../../../../components/plans/plan-editor-screen';

export default PlanScreen;
