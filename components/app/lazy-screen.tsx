/**
 * A route screen whose code is fetched when the route is first opened, so the sign-in screen does not carry the
 * whole signed-in app (the first screen has a size budget: tests/support/web-budget.ts). The screens are grouped by
 * who opens them together — the pilot's field screens, the office screens — because Metro puts code shared by two
 * lazily loaded files into one file that every page loads up front; one group each keeps that shared file small.
 *
 * No React.lazy/Suspense here on purpose: a screen whose group has already arrived (fetched while the app started,
 * components/app/screen-groups.ts) draws at once, and one still on its way shows a loading state for exactly as
 * long as it takes, not the extra moment React adds before revealing suspended content.
 */
import { useEffect, useState, type ComponentType } from 'react';
import type { ScreenGroup } from '../../contracts/screen-groups';
import { Banner, Button, Loading, Screen } from '../ui';
import { loadedScreenGroup, loadScreenGroup, type ScreenModules } from './screen-groups';

/** The route component for the screen `pick` chooses from `group`, with a loading state and a retry. */
export function lazyScreen<G extends ScreenGroup, P extends object>(group: G, pick: (m: ScreenModules[G]) => ComponentType<P>): ComponentType<P> {
  const arrived = (): ComponentType<P> | null => {
    const m = loadedScreenGroup(group);
    return m ? pick(m) : null;
  };
  function LazyScreen(props: P) {
    // Held in state as a function's result: a component stored directly would be called as an updater.
    const [Chosen, setChosen] = useState<ComponentType<P> | null>(arrived);
    const [error, setError] = useState<Error | null>(null);
    const [attempt, setAttempt] = useState(0);
    useEffect(() => {
      if (Chosen) return;
      let live = true;
      loadScreenGroup(group).then(
        (m) => live && setChosen(() => pick(m)),
        (e: unknown) => live && setError(e instanceof Error ? e : new Error(String(e))),
      );
      return () => {
        live = false;
      };
    }, [Chosen, attempt]);
    if (error) {
      return (
        <Screen title="This screen could not be opened" testID="screen-load-failure">
          <Banner
            tone="danger"
            message={`Its code did not arrive (${error.message}). Check the connection, then try again; screens opened before stay on the device.`}
          >
            <Button
              label="Try again"
              variant="secondary"
              size="compact"
              testID="screen-load-retry"
              onPress={() => {
                setError(null);
                setAttempt((n) => n + 1);
              }}
            />
          </Banner>
        </Screen>
      );
    }
    if (!Chosen) return <Loading fill label="Opening the screen…" />;
    return <Chosen {...props} />;
  }
  LazyScreen.displayName = `LazyScreen(${group})`;
  return LazyScreen;
}
