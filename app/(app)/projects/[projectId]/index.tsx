/** Route /projects/:projectId. */
import { lazyScreen } from '../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.ProjectScreen);
