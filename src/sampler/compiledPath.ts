import { existsSync } from 'node:fs';
import { dirname, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The compiled JavaScript file for a module of this package, given the `import.meta.url` of a module next
 * to it and the sibling's name. Worker threads and child processes need compiled JS; when the caller itself
 * runs from TypeScript source (vitest), the sibling is looked up in `dist/` (which `npm test` builds first).
 */
export function compiledSibling(importMetaUrl: string, siblingJs: string): string {
  const here = fileURLToPath(importMetaUrl);
  const dir = dirname(here);
  if (!here.endsWith('.ts')) return resolve(dir, siblingJs);
  // <root>/src/<...>/x.ts -> <root>/dist/src/<...>/siblingJs.
  const idx = `${dir}${sep}`.lastIndexOf(`${sep}src${sep}`);
  if (idx < 0) throw new Error(`cannot place ${here} in a src/ folder to find its compiled sibling`);
  const root = dir.slice(0, idx);
  const out = resolve(root, 'dist', relative(root, dir), siblingJs);
  if (!existsSync(out)) throw new Error(`${out} does not exist: run "npm run build" first (workers load compiled JavaScript)`);
  return out;
}
