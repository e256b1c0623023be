/**
 * The app's fonts for the browser: the shipped TTFs subset to the characters Loftline's screens use and written as
 * WOFF2 (subset-font, which runs HarfBuzz's subsetter), named by content hash so they can be cached for a year, and
 * declared in the page with `font-display: swap`: text paints at once in a system font and swaps when the file
 * arrives, so a weak field connection never waits for fonts before showing a leg sheet.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import subsetFont from 'subset-font';
import { fontFaces } from '../../components/theme/tokens';
import { projectRoot } from './paths';

/** Family name (as the screens use it) → the TTF shipped by the font package. */
const sources: Record<string, string> = {
  [fontFaces.regular]: '@expo-google-fonts/inter/400Regular/Inter_400Regular.ttf',
  [fontFaces.medium]: '@expo-google-fonts/inter/500Medium/Inter_500Medium.ttf',
  [fontFaces.semibold]: '@expo-google-fonts/inter/600SemiBold/Inter_600SemiBold.ttf',
  [fontFaces.bold]: '@expo-google-fonts/inter/700Bold/Inter_700Bold.ttf',
  [fontFaces.mono]: '@expo-google-fonts/jetbrains-mono/400Regular/JetBrainsMono_400Regular.ttf',
  [fontFaces.monoMedium]: '@expo-google-fonts/jetbrains-mono/500Medium/JetBrainsMono_500Medium.ttf',
};

/** Printable ASCII, Latin-1 (names of people and places), and the symbols the screens print. */
const fontCharacters = (() => {
  let s = '';
  for (let c = 0x20; c <= 0x7e; c++) s += String.fromCharCode(c);
  for (let c = 0xa0; c <= 0x17f; c++) s += String.fromCharCode(c);
  return s + '–—‘’“”•…‰′″€→←↑↓↗↘−×÷±≤≥≈≠°²³µσΔ·✓✕⚠';
})();

/** Write the WOFF2 subsets into `dist/fonts/` and return the `<style>` and preload tags for the page head. */
export async function writeWebFonts(dist: string): Promise<string> {
  const outDir = path.join(dist, 'fonts');
  fs.mkdirSync(outDir, { recursive: true });
  const faces: string[] = [];
  const preloads: string[] = [];
  for (const [family, rel] of Object.entries(sources)) {
    const ttf = fs.readFileSync(path.join(projectRoot, 'node_modules', rel));
    const woff2 = await subsetFont(ttf, fontCharacters, { targetFormat: 'woff2' });
    const name = `${family}.${crypto.createHash('sha256').update(woff2).digest('hex').slice(0, 20)}.woff2`;
    fs.writeFileSync(path.join(outDir, name), woff2);
    faces.push(`@font-face{font-family:"${family}";src:url("/fonts/${name}") format("woff2");font-display:swap;}`);
    // The body text face is on every screen: fetch it with the page instead of after the first layout.
    if (family === fontFaces.regular) preloads.push(`<link rel="preload" href="/fonts/${name}" as="font" type="font/woff2" crossorigin>`);
  }
  return `${preloads.join('')}<style id="loftline-fonts">${faces.join('')}</style>`;
}

/** Put the font tags into the exported page's head (once). */
export function injectFontTags(indexHtml: string, tags: string): string {
  const cleaned = indexHtml.replace(/<link rel="preload"[^>]*as="font"[^>]*>/g, '').replace(/<style id="loftline-fonts">[\s\S]*?<\/style>/, '');
  return cleaned.replace('</head>', `${tags}</head>`);
}
