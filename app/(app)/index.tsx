/** Route /: the current role's home screen. */
import { HomeRedirect } from '../../components/navigation/home-redirect';

export default HomeRedirect;
