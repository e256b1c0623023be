/** Route /team: the current team's members. */
import { MembersScreen } from '../../components/team/members-screen';

export default MembersScreen;
