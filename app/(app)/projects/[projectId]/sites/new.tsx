/** Route /projects/:projectId/sites/new: upload an elevation grid. */
import { lazyScreen } from '../../../../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.SiteUploadScreen);
