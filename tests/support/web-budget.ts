/**
 * What the first screen (sign-in, cold cache) may transfer, measured in Chromium as bytes on the wire. The product
 * target for JavaScript is 400 KB gzip; the app shell (expo-router, react-native-web, react-dom) alone is about
 * 290 KB, and zod, the query and form libraries and the auth client bring it to about 780 KB today, so the budget
 * guards against growth while the target is worked towards (see the README's speed section).
 */
export const FIRST_SCREEN_JS_GZIP_BUDGET_BYTES = 800 * 1024;
/** Fonts of the first screen (WOFF2 subsets; the page paints with system fonts before they arrive). */
export const FIRST_SCREEN_FONT_BUDGET_BYTES = 200 * 1024;
