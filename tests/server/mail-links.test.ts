/**
 * Every link an e-mail carries must open a screen of the web app, not "Page not found": each link built by
 * server/mail/templates.ts is matched against the routes that the app/ folder declares (Expo Router's file
 * conventions: `(group)` folders add nothing to the path, `[param]` matches one segment, `index` is the folder).
 */
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { links } from '../../server/mail/templates';

function appRoutes(dir = 'app', prefix = ''): RegExp[] {
  const out: RegExp[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) {
      const seg = /^\(.*\)$/.test(e.name) ? '' : `/${e.name}`;
      out.push(...appRoutes(full, prefix + seg));
      continue;
    }
    const name = e.name.replace(/\.tsx?$/, '');
    if (name.startsWith('_') || name.startsWith('+')) continue; // layouts, not-found and html shells are not screens
    const route = name === 'index' ? prefix || '/' : `${prefix}/${name}`;
    const pattern = route.split('/').map((s) => (/^\[.+\]$/.test(s) ? '[^/]+' : s.replace(/[.*+?^${}()|\\]/g, '\\$&'))).join('/');
    out.push(new RegExp(`^${pattern}$`));
  }
  return out;
}

const routes = appRoutes();
const base = 'https://loftline.example';
const opens = (url: string) => routes.some((r) => r.test(new URL(url).pathname));

describe('links in e-mails', () => {
  it('reads the app routes from the app folder (the check itself sees the screens)', () => {
    expect(opens(`${base}/projects`)).toBe(true);
    expect(opens(`${base}/no-such-screen`)).toBe(false);
  });

  it('point at screens the app serves: invitation, plan version, leg sheet and flights', () => {
    const id = '3f1c2a4e-5b6d-4e7f-8a9b-0c1d2e3f4a5b';
    for (const url of [links.invitation(base, 'tok_en-1'), links.version(base, id, id, id), links.legSheet(base, id), links.flights(base)]) {
      expect(opens(url), url).toBe(true);
    }
  });
});
