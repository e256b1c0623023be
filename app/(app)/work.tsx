/** Route /work: what waits for the signed-in person. */
import { WorkScreen } from '../../components/work/work-screen';

export default WorkScreen;
