/** Route /flights. */
import { lazyScreen } from '../../../components/app/lazy-screen';

export default lazyScreen(() => import('../../../components/app/field-screens').then((m) => m.FlightsScreen));
