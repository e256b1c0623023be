/** Route /teams: the team switcher and team creation. */
import { lazyScreen } from '../../components/app/lazy-screen';

export default lazyScreen('office', (m) => m.TeamsScreen);
