/** Route /projects. */
import { ProjectsScreen } from '../../../components/projects/projects-screen';

export default ProjectsScreen;
