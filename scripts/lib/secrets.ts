/** A per-checkout auth secret kept in the git-ignored data folder, made on first start. */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { dataDir } from './paths';

export function localAuthSecret(): string {
  const file = path.join(dataDir, 'auth-secret');
  fs.mkdirSync(dataDir, { recursive: true });
  if (!fs.existsSync(file)) fs.writeFileSync(file, crypto.randomBytes(32).toString('base64url'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}
