/**
 * A route screen whose code is fetched when the route is first opened, so the sign-in screen does not carry the
 * whole signed-in app (the first screen has a size budget: tests/support/web-budget.ts). The screens are grouped by
 * who opens them together — the pilot's field screens, the office screens — because Metro puts code shared by two
 * lazily loaded files into one file that every page loads up front; one group each keeps that shared file small.
 */
import { Component, lazy, Suspense, useState, type ComponentType, type ReactNode } from 'react';
import { Banner, Button, Loading, Screen } from '../ui';

type Loader<P> = () => Promise<ComponentType<P>>;

/** Wraps a screen loader as a route component with a loading state and a retry when the code cannot be fetched. */
export function lazyScreen<P extends object>(load: Loader<P>): ComponentType<P> {
  const makeLazy = () => lazy(async () => ({ default: await load() }));
  let Lazy = makeLazy();
  function LazyScreen(props: P) {
    const [attempt, setAttempt] = useState(0);
    const retry = () => {
      Lazy = makeLazy(); // React keeps a failed lazy load for good; a new one fetches again
      setAttempt((n) => n + 1);
    };
    return (
      <LoadFailure key={attempt} onRetry={retry}>
        <Suspense fallback={<Loading fill label="Opening the screen…" />}>
          <Lazy {...props} />
        </Suspense>
      </LoadFailure>
    );
  }
  return LazyScreen;
}

/** Shown when the screen's code could not be fetched (no signal, or a new version replaced the old files). */
class LoadFailure extends Component<{ children: ReactNode; onRetry: () => void }, { error: Error | null }> {
  state = { error: null as Error | null };
  static getDerivedStateFromError(error: Error) {
    return { error };
  }
  render() {
    if (!this.state.error) return this.props.children;
    return (
      <Screen title="This screen could not be opened">
        <Banner
          tone="danger"
          message={`Its code did not arrive (${this.state.error.message}). Check the connection, then try again; screens opened before stay on the device.`}
        >
          <Button label="Try again" variant="secondary" size="compact" onPress={this.props.onRetry} />
        </Banner>
      </Screen>
    );
  }
}
