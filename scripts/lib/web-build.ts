/** Build the web app with `expo export` only when its sources changed since the last build. */
import { spawnSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { distDir, projectRoot } from './paths';
import { precompress } from './precompress';
import { writeServiceWorker } from './service-worker';
import { foldCommonChunk } from './web-chunks';
import { injectFontTags, writeWebFonts } from './web-fonts';

const inputs = ['app', 'components', 'contracts', 'terrain', 'assets', 'app.json', 'metro.config.js', 'scripts/web', 'package-lock.json', 'tsconfig.json', 'scripts/lib/web-fonts.ts', 'scripts/lib/service-worker.ts', 'scripts/lib/web-chunks.ts', 'scripts/lib/precompress.ts'];

function hashInputs(): string {
  const h = crypto.createHash('sha256');
  const walk = (p: string) => {
    const full = path.join(projectRoot, p);
    if (!fs.existsSync(full)) return;
    const st = fs.statSync(full);
    if (st.isDirectory()) {
      for (const name of fs.readdirSync(full).sort()) walk(path.join(p, name));
    } else {
      h.update(p);
      h.update(fs.readFileSync(full));
    }
  };
  inputs.forEach(walk);
  return h.digest('hex');
}

/** Export the web build into dist/ if the sources differ from the recorded hash; returns the dist folder. */
export async function ensureWebBuild(opts: { force?: boolean } = {}): Promise<string> {
  const stamp = path.join(distDir, '.source-hash');
  const hash = hashInputs();
  if (!opts.force && fs.existsSync(stamp) && fs.readFileSync(stamp, 'utf8') === hash && fs.existsSync(path.join(distDir, 'index.html'))) {
    return distDir;
  }
  copySkiaWasm();
  console.log('loftline: building the web app (expo export)…');
  const t0 = Date.now();
  // Build beside dist/ and swap it in, so a server or test run serving the old build never sees a half-written one.
  const staging = `${distDir}.build-${process.pid}`;
  fs.rmSync(staging, { recursive: true, force: true });
  const r = spawnSync('npx', ['expo', 'export', '--platform', 'web', '--output-dir', path.basename(staging)], {
    cwd: projectRoot,
    stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1', NODE_ENV: 'production' },
  });
  if (r.status !== 0) {
    fs.rmSync(staging, { recursive: true, force: true });
    throw new Error('The web build failed (see the expo output above).');
  }
  const fold = foldCommonChunk(staging);
  if (fold.commonBytes) console.log(`loftline: shared screen code (${(fold.commonBytes / 1024).toFixed(0)} KiB) moved off the first screen into ${fold.foldedInto.join(', ')}`);
  // Fonts as WOFF2 subsets declared with font-display: swap (scripts/lib/web-fonts.ts); the page never waits for them.
  const indexFile = path.join(staging, 'index.html');
  fs.writeFileSync(indexFile, injectFontTags(fs.readFileSync(indexFile, 'utf8'), await writeWebFonts(staging)));
  const sw = await writeServiceWorker(staging);
  console.log(`loftline: service worker keeps ${sw.count} files (${(sw.sizeBytes / 1024).toFixed(0)} KiB) for offline starts`);
  const packed = await precompress(staging);
  console.log(`loftline: ${packed.files} files precompressed (${(packed.bytes / 1048576).toFixed(1)} MiB → ${(packed.brotliBytes / 1048576).toFixed(1)} MiB as brotli)`);
  fs.writeFileSync(path.join(staging, '.source-hash'), hash);
  const old = `${distDir}.old-${process.pid}`;
  if (fs.existsSync(distDir)) fs.renameSync(distDir, old);
  fs.renameSync(staging, distDir);
  fs.rmSync(old, { recursive: true, force: true });
  console.log(`loftline: web app built in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
  return distDir;
}

/** Charts draw with Skia's CanvasKit on the web: serve its wasm from our own build instead of a CDN. */
function copySkiaWasm(): void {
  const src = path.join(projectRoot, 'node_modules', 'canvaskit-wasm', 'bin', 'full', 'canvaskit.wasm');
  const dest = path.join(projectRoot, 'public', 'canvaskit.wasm');
  if (!fs.existsSync(src)) return;
  fs.mkdirSync(path.dirname(dest), { recursive: true });
  if (!fs.existsSync(dest) || fs.statSync(dest).size !== fs.statSync(src).size) fs.copyFileSync(src, dest);
}
