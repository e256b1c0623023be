/**
 * What the first screen (sign-in, cold cache) may transfer, measured in Chromium as bytes on the wire: the product
 * target, 400 KB of gzipped JavaScript. About 376 KB today (3 Dec 2026): the app shell (expo-router, react-native-web,
 * react-dom) is most of it; the signed-in screens load on first use in two groups (components/app/lazy-screen.tsx),
 * zod's locales, JSON Schema conversion and compiler are left out of the web bundle (metro.config.js), and the shared
 * screen code is folded into the groups (scripts/lib/web-chunks.ts).
 */
export const FIRST_SCREEN_JS_GZIP_BUDGET_BYTES = 400 * 1000;
/** Fonts of the first screen (WOFF2 subsets; the page paints with system fonts before they arrive). */
export const FIRST_SCREEN_FONT_BUDGET_BYTES = 200 * 1024;
