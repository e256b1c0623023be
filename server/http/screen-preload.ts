/**
 * A `Link: rel=preload` header on the app shell naming the screen group the address opens (components/app/
 * field-screens.ts or office-screens.ts), so the browser fetches that group beside the first script instead of
 * after it has run: on a weak field signal (150 ms round trips) the pilot's leg sheet would otherwise wait for the
 * entry script, then a round trip, then the group.
 */
import fs from 'node:fs';
import path from 'node:path';
import { screenGroupOf, type ScreenGroup } from '../../contracts/screen-groups';

const scriptDir = path.join('_expo', 'static', 'js', 'web');

/** Returns the header value for a request path, or null; reads the build's file names once. */
export function screenPreloader(webDist: string): (urlPath: string) => string | null {
  let files: Record<ScreenGroup, string | undefined> | null = null;
  return (urlPath) => {
    const group = screenGroupOf(urlPath);
    if (!group) return null;
    if (!files) {
      const names = fs.existsSync(path.join(webDist, scriptDir)) ? fs.readdirSync(path.join(webDist, scriptDir)) : [];
      const find = (prefix: string) => names.find((n) => n.startsWith(`${prefix}-screens-`) && n.endsWith('.js'));
      files = { field: find('field'), office: find('office') };
    }
    const file = files[group];
    return file ? `</${scriptDir.split(path.sep).join('/')}/${file}>; rel=preload; as=script` : null;
  };
}
