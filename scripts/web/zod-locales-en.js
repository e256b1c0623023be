// The web bundle's stand-in for zod's locale index (metro.config.js): Loftline's messages are English and its own,
// and Metro does not tree-shake, so the 40-odd other locales (about 270 KB minified) would otherwise reach every
// screen. `z.locales.en` stays available; any other locale is absent on the web.
export { default as en } from 'zod/v4/locales/en.js';
