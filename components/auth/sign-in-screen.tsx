/** The sign-in screen. */
import { useLocalSearchParams } from 'expo-router';
import { Banner, Text, TextLink } from '../ui';
import { AuthFrame } from './auth-frame';
import { SignInForm } from './sign-in-form';

/** After a sign-up the server does not sign the user in; `?created=1` explains what to do next. */
export function SignInScreen() {
  const { created } = useLocalSearchParams<{ created?: string }>();
  return (
    <AuthFrame
      title="Sign in"
      footer={
        <>
          <Text tone="muted">New to Loftline?</Text>
          <TextLink href="/sign-up" label="Create an account" testID="go-sign-up" />
        </>
      }
    >
      {created === '1' ? (
        <Banner
          tone="success"
          testID="sign-up-done"
          message="Thanks. If that address was new, your account is ready: sign in with it below. If it already had an account, sign in with its existing password."
        />
      ) : null}
      <SignInForm />
    </AuthFrame>
  );
}
