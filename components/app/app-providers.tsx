/** App-wide providers: the query client. Fonts come from the page's own @font-face rules and never block a paint. */
import { QueryClientProvider } from '@tanstack/react-query';
import { useEffect, useState, type ReactNode } from 'react';
import { keepDeviceQueries, restoreDeviceQueries } from '../api/device-queries';
import { createQueryClient } from '../api/query-client';
import { registerOfflineShell } from './offline-shell';

function createClientWithDeviceCopy() {
  const client = createQueryClient();
  restoreDeviceQueries(client);
  return client;
}

export function AppProviders({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createClientWithDeviceCopy);
  useEffect(() => keepDeviceQueries(queryClient), [queryClient]);
  useEffect(() => registerOfflineShell(), []);
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
