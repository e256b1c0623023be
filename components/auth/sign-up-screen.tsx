/** The sign-up screen. */
import { useRouter } from 'expo-router';
import { Text, TextLink } from '../ui';
import { AuthFrame } from './auth-frame';
import { SignUpForm } from './sign-up-form';

/** A new account starts with no team; after signing in the app asks the user to create one. */
export function SignUpScreen() {
  const router = useRouter();
  return (
    <AuthFrame
      title="Create an account"
      footer={
        <>
          <Text tone="muted">Already have an account?</Text>
          <TextLink href="/sign-in" label="Sign in" testID="go-sign-in" />
        </>
      }
    >
      <SignUpForm onDone={() => router.replace({ pathname: '/sign-in', params: { created: '1' } })} />
    </AuthFrame>
  );
}
