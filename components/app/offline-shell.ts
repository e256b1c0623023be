/**
 * Registers the service worker (written by the web build with Workbox, scripts/lib/service-worker.ts) that keeps the
 * app's own files on the device, so a reload with no network still opens the app. Registered once the page has
 * loaded and gone quiet, so its downloads never compete with the first screen on a weak connection.
 */
import { Platform } from 'react-native';

export function registerOfflineShell(): void {
  if (Platform.OS !== 'web' || typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  if (process.env.NODE_ENV !== 'production') return; // the development server has no worker to serve
  const register = () => {
    void import('workbox-window')
      .then(({ Workbox }) => new Workbox('/sw.js').register())
      .catch(() => undefined); // no worker (private mode, an old browser): the app works online as before
  };
  if (document.readyState === 'complete') setTimeout(register, 1000);
  else window.addEventListener('load', () => setTimeout(register, 1000), { once: true });
}
