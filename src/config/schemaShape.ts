import type { z } from 'zod';

interface ZodInternals {
  _zod: {
    def: {
      type: string;
      shape?: Record<string, unknown>;
      innerType?: unknown;
      element?: unknown;
      in?: unknown;
      options?: unknown[];
      keyType?: unknown;
      valueType?: unknown;
      entries?: Record<string, unknown>;
    };
  };
}

/**
 * The keys valid at `path` inside a zod schema, for "did you mean" suggestions. Walks through the
 * wrappers zod puts around objects (optional, default, pipe, refinements, unions). Reads zod's `_zod.def`,
 * its documented internals for introspection in v4.
 */
export function keysAt(schema: z.ZodType, path: readonly PropertyKey[]): string[] {
  let nodes: unknown[] = [schema];
  for (const seg of path) {
    nodes = nodes.flatMap((n) => childrenOf(n, seg));
  }
  const keys = new Set<string>();
  for (const n of nodes) {
    for (const obj of objectsOf(n)) for (const k of Object.keys(obj)) keys.add(k);
    for (const k of recordKeysOf(n)) keys.add(k);
  }
  return [...keys];
}

function unwrap(node: unknown): unknown[] {
  const def = (node as ZodInternals)._zod?.def;
  if (!def) return [];
  switch (def.type) {
    case 'optional':
    case 'default':
    case 'prefault':
    case 'nullable':
    case 'readonly':
    case 'catch':
      return unwrap(def.innerType);
    case 'pipe':
      return unwrap(def.in);
    case 'union':
      return (def.options ?? []).flatMap(unwrap);
    default:
      return [node];
  }
}

function objectsOf(node: unknown): Record<string, unknown>[] {
  return unwrap(node)
    .map((n) => (n as ZodInternals)._zod.def)
    .filter((d) => d.type === 'object' && d.shape)
    .map((d) => d.shape as Record<string, unknown>);
}

/** Keys a record with an enum key type accepts (e.g. the band names of [photometry]). */
function recordKeysOf(node: unknown): string[] {
  return unwrap(node).flatMap((n) => {
    const def = (n as ZodInternals)._zod.def;
    if (def.type !== 'record' || def.keyType === undefined) return [];
    const keyDef = (def.keyType as ZodInternals)._zod.def;
    return keyDef.type === 'enum' && keyDef.entries ? Object.keys(keyDef.entries) : [];
  });
}

function childrenOf(node: unknown, seg: PropertyKey): unknown[] {
  const out: unknown[] = [];
  for (const n of unwrap(node)) {
    const def = (n as ZodInternals)._zod.def;
    if (def.type === 'object' && def.shape && typeof seg === 'string' && seg in def.shape) out.push(def.shape[seg]);
    if (def.type === 'array' && typeof seg === 'number') out.push(def.element);
    if (def.type === 'record' && def.valueType !== undefined) out.push(def.valueType);
  }
  return out;
}
