import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | undefined;

/**
 * coeval's version, from its package.json (found by walking up from this module, which sits at a different
 * depth in src/ under the tests and in dist/ when installed). Outputs record it for provenance.
 */
export function coevalVersion(): string {
  if (cached) return cached;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    const file = join(dir, 'package.json');
    if (existsSync(file)) {
      const pkg = JSON.parse(readFileSync(file, 'utf8')) as { name?: string; version?: string };
      if (pkg.name === 'coeval' && pkg.version) return (cached = pkg.version);
    }
    dir = dirname(dir);
  }
  return (cached = 'unknown');
}
