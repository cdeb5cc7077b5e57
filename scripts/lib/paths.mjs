// Where the project keeps its local state. Everything under .data/ is git-ignored.
import { fileURLToPath } from 'node:url';
import path from 'node:path';

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const dataDir = path.join(repoRoot, '.data');
