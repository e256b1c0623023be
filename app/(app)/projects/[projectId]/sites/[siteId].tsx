/** Route /projects/:projectId/sites/:siteId. */
import { SiteScreen } from '../../../../../components/sites/site-screen';

export default SiteScreen;
