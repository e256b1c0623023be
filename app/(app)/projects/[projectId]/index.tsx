/** Route /projects/:projectId. */
import { ProjectScreen } from '../../../../components/projects/project-screen';

export default ProjectScreen;
