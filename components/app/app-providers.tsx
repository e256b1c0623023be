/** App-wide providers: the query client and the shipped fonts. */
import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { useState, type ReactNode } from 'react';
import { createQueryClient } from '../api/query-client';
import { fontFiles } from '../theme/fonts';

/** Renders nothing until the fonts are ready (they come from the same server, so this is brief); a font error falls back to system fonts. */
export function AppProviders({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  const [fontsLoaded, fontError] = useFonts(fontFiles);
  if (!fontsLoaded && !fontError) return null;
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
