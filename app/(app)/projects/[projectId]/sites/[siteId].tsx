/** Route /projects/:projectId/sites/:siteId. */
import { lazyScreen } from '../../../../../components/app/lazy-screen';

export default lazyScreen(() => import('../../../../../components/app/office-screens').then((m) => m.SiteScreen));
