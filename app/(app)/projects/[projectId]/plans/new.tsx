/** Route /projects/:projectId/plans/new (?siteId=). */
import { NewPlanScreen } from '../../../../../components/plans/plan-editor-screen';

export default NewPlanScreen;
