/** The sign-in screen. */
import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { Banner, Text, TextLink } from '../ui';
import { AuthFrame } from './auth-frame';
import { DemoAccounts } from './demo-accounts';
import { SignInForm, type SignInPrefill } from './sign-in-form';

/** After a sign-up whose immediate sign-in was refused (the address had an account already), `?created=1` explains what to do next. */
export function SignInScreen() {
  const { created } = useLocalSearchParams<{ created?: string }>();
  const [prefill, setPrefill] = useState<SignInPrefill | null>(null);
  return (
    <AuthFrame
      title="Sign in"
      footer={
        <>
          <Text tone="muted">New to Loftline?</Text>
          <TextLink href="/sign-up" label="Create an account" testID="go-sign-up" />
        </>
      }
      aside={<DemoAccounts onPick={(email) => setPrefill({ email })} />}
    >
      {created === '1' ? (
        <Banner
          tone="success"
          testID="sign-up-done"
          message="Not signed in with that password. If that address already had an account, sign in below with its own password."
        />
      ) : null}
      <SignInForm prefill={prefill} />
    </AuthFrame>
  );
}
