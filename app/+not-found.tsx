/** Any address no route matches. */
import { NotFoundScreen } from '../components/navigation/not-found-screen';

export default NotFoundScreen;
