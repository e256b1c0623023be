/** Route /team: the current team's members. */
import { lazyScreen } from '../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.MembersScreen);
