/** Root layout: app-wide providers and a header-less stack of the signed-out and signed-in areas. */
import { Stack } from 'expo-router';
import { AppProviders } from '../components/app/app-providers';

export default function RootLayout() {
  return (
    <AppProviders>
      <Stack screenOptions={{ headerShown: false }} />
    </AppProviders>
  );
}
