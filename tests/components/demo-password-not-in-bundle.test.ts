/** The demo password is for the README and the server's start-up output only: no web-app source (or build) carries it. */
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/seed/demo-password';

function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true, recursive: true }).filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
}

const containing = (files: string[]) => files.filter((f) => fs.readFileSync(f).includes(demoPassword));

describe('the demo password stays out of the web app', () => {
  it('is in no source the web bundle is built from (app/, components/, contracts/)', () => {
    const sources = ['app', 'components', 'contracts'].flatMap((d) => filesUnder(path.resolve(d)));
    expect(sources.length).toBeGreaterThan(20);
    expect(containing(sources)).toEqual([]);
  });

  it('is in no file of the built web app, when there is one', () => {
    const dist = process.env.LOFTLINE_WEB_DIST;
    const built = dist ? filesUnder(dist).filter((f) => /\.(js|html|json|map)$/.test(f)) : [];
    expect(containing(built)).toEqual([]);
  });
});
