/** Route /profile. */
import { ProfileScreen } from '../../components/profile/profile-screen';

export default ProfileScreen;
