/** Route /projects/:projectId/sites/new: upload an elevation grid. */
import { SiteUploadScreen } from '../../../../../components/sites/site-upload-screen';

export default SiteUploadScreen;
