/**
 * The app's service worker, written into the web build by Workbox (workbox-build's generateSW): the page shell,
 * the first screen's scripts and the fonts are kept on the device when the worker installs, so a reload with no
 * network opens the app; every other hashed file (chart code, CanvasKit) is kept the first time it is used.
 * The API is never cached here: the app keeps its own device copies, with their time, and says when it shows them.
 */
import path from 'node:path';
import { generateSW } from 'workbox-build';

export async function writeServiceWorker(buildDir: string): Promise<{ count: number; sizeBytes: number }> {
  const r = await generateSW({
    globDirectory: buildDir,
    // What the first screen needs and the pilot's field screens (components/app/field-screens.ts), so a reload in the
    // field opens the leg sheet with no network; the office screens are kept the first time they are used.
    globPatterns: ['index.html', 'favicon.ico', 'fonts/*.woff2', '_expo/static/js/web/{entry,__common,__expo-metro-runtime,field-screens}-*.js'],
    swDest: path.join(buildDir, 'sw.js'),
    mode: 'production',
    // The largest kept script is about 1 MB before compression; it must be kept all the same.
    maximumFileSizeToCacheInBytes: 8 * 1024 * 1024,
    inlineWorkboxRuntime: true, // one same-origin script: nothing for the Content-Security-Policy to refuse
    sourcemap: false,
    skipWaiting: true,
    clientsClaim: true,
    cleanupOutdatedCaches: true,
    // Every route of the single-page app is the same shell; the API and downloads are left to the network.
    navigateFallback: '/index.html',
    navigateFallbackDenylist: [/^\/api\//],
    // Names that carry a content hash never change, so they need no revision of their own.
    dontCacheBustURLsMatching: /[.-][0-9a-f]{16,}\.[a-z0-9]+$/,
    runtimeCaching: [
      {
        urlPattern: ({ url, sameOrigin }) => sameOrigin && (url.pathname.startsWith('/_expo/static/') || url.pathname.endsWith('.wasm') || url.pathname.startsWith('/assets/')),
        handler: 'CacheFirst',
        options: { cacheName: 'loftline-app-files', expiration: { maxEntries: 80 } },
      },
    ],
  });
  if (r.warnings.length) console.warn(`loftline: service worker: ${r.warnings.join('; ')}`);
  return { count: r.count, sizeBytes: r.size };
}
