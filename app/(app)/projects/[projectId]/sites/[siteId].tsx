/** Route /projects/:projectId/sites/:siteId. */
import { lazyScreen } from '../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.SiteScreen);
