/** Root layout: app-wide providers and a header-less stack of the signed-out and signed-in areas. */
import { Stack } from 'expo-router';
import { Platform } from 'react-native';
import { AppProviders } from '../components/app/app-providers';
import { preloadScreenGroupFor } from '../components/app/screen-groups';

// The screens this address opens start arriving now, while the app is still starting (the server also names them
// in a preload header; this covers a page the service worker answered, which has no header).
if (Platform.OS === 'web' && typeof location !== 'undefined') preloadScreenGroupFor(location.pathname);

export default function RootLayout() {
  return (
    <AppProviders>
      <Stack screenOptions={{ headerShown: false }} />
    </AppProviders>
  );
}
