/** Route /sign-in. */
import { SignInScreen } from '../../components/auth/sign-in-screen';

export default SignInScreen;
