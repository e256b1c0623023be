/** Folders of the project that the scripts use. */
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const dataDir = path.join(projectRoot, '.data');
export const distDir = path.join(projectRoot, 'dist');
export const artifactsDir = path.join(projectRoot, '.artifacts');
