/** The signed-in area's gate: no session → sign-in; no team → the team screen; otherwise the navigation shell. */
import { Redirect, usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { ApiError, errorMessage } from '../api/api-error';
import { useMe } from '../api/me.queries';
import { AppShell } from '../navigation/app-shell';
import { CurrentTeamProvider } from '../team/current-team-context';
import { Banner, Button, Loading, Screen } from '../ui';

/** Wraps every screen of the (app) route group. */
export function SignedInGate({ children }: { children: ReactNode }) {
  const me = useMe();
  const pathname = usePathname();

  if (me.isPending) return <Loading fill label="Checking your session…" />;
  if (me.isError && me.error instanceof ApiError && me.error.isUnauthenticated) return <Redirect href="/sign-in" />;
  // A later check that fails for want of a network keeps what was loaded (a pilot's leg sheet in the field).
  if (me.isError && !me.data) {
    return (
      <Screen title="Loftline is not answering">
        <Banner tone="danger" message={errorMessage(me.error)}>
          <Button label="Try again" variant="secondary" size="compact" onPress={() => void me.refetch()} />
        </Banner>
      </Screen>
    );
  }
  if (!me.data) return <Loading fill label="Checking your session…" />;
  // A user with no team can do nothing but create one (or wait to be added).
  if (me.data.teams.length === 0 && pathname !== '/teams' && pathname !== '/profile') return <Redirect href="/teams" />;

  return (
    <CurrentTeamProvider me={me.data}>
      <AppShell>{children}</AppShell>
    </CurrentTeamProvider>
  );
}
