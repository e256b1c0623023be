/** The screen for an address that matches no route. */
import { usePathname } from 'expo-router';
import { BrandMark } from '../layout/brand-mark';
import { EmptyState, Screen, TextLink } from '../ui';

/** Says which address was not found and offers the way back. */
export function NotFoundScreen() {
  const pathname = usePathname();
  return (
    <Screen testID="not-found-screen" standalone documentTitle="Page not found">
      <BrandMark />
      <EmptyState
        title="Page not found"
        level={1}
        message={`Nothing lives at ${pathname}. It may have moved, or the link was mistyped.`}
        action={<TextLink href="/" label="Go to Loftline" testID="not-found-home" />}
      />
    </Screen>
  );
}
