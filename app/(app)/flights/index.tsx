/** Route /flights. */
import { lazyScreen } from '../../../components/app/lazy-screen';

export default lazyScreen('field', (m) => m.FlightsScreen);
