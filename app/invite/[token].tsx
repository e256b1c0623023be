/** Route /invite/:token: the link in an invitation e-mail, usable signed in or signed out. */
import { InviteAcceptScreen } from '../../components/invitations/invite-accept-screen';

export default InviteAcceptScreen;
