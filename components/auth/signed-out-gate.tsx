/** The signed-out area's gate: someone already signed in goes straight into the app. */
import { Redirect } from 'expo-router';
import type { ReactNode } from 'react';
import { useMe } from '../api/me.queries';
import { Loading } from '../ui';

/** Any failure of the session check (401, or the server down) leaves the sign-in forms on screen. */
export function SignedOutGate({ children }: { children: ReactNode }) {
  const me = useMe();
  if (me.isPending) return <Loading fill label="Checking your session…" />;
  if (me.isSuccess) return <Redirect href="/" />;
  return <>{children}</>;
}
