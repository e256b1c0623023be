/** Route /sign-up. */
import { SignUpScreen } from '../../components/auth/sign-up-screen';

export default SignUpScreen;
