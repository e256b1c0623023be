/** Route /teams: the team switcher and team creation. */
import { TeamsScreen } from '../../components/team/teams-screen';

export default TeamsScreen;
