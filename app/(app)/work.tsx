/** Route /work: what waits for the signed-in person. */
import { lazyScreen } from '../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.WorkScreen);
