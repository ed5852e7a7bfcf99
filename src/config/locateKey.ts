/**
 * Best-effort line lookup for a dotted key path in TOML text. smol-toml returns plain objects without
 * positions, so validation errors would otherwise name only the key. This scanner follows `[table]`,
 * `[[array]]` headers and `key = value` lines, which covers the configs people write by hand; it returns
 * undefined when it cannot tell (inline tables, multi-line values), and the message then names the key only.
 */
export function locateKey(text: string, path: readonly (string | number)[]): { line: number; column: number } | undefined {
  const lines = text.split(/\r?\n/);
  let table: string[] = [];
  const arrayCounts = new Map<string, number>();
  const want = path.map(String);
  let best: { line: number; column: number; depth: number } | undefined;

  const headerOf = (raw: string): string[] =>
    raw
      .split('.')
      .map((s) => s.trim().replace(/^"(.*)"$/, '$1'));

  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    const trimmed = line.trim();
    if (trimmed === '' || trimmed.startsWith('#')) continue;
    let m = /^\[\[\s*([^\]]+?)\s*\]\]/.exec(trimmed);
    if (m) {
      const name = headerOf(m[1]);
      const key = name.join('.');
      const idx = arrayCounts.get(key) ?? 0;
      arrayCounts.set(key, idx + 1);
      table = [...name, String(idx)];
      consider(table, i, line.indexOf('[') + 1);
      continue;
    }
    m = /^\[\s*([^\]]+?)\s*\]/.exec(trimmed);
    if (m) {
      table = headerOf(m[1]);
      consider(table, i, line.indexOf('[') + 1);
      continue;
    }
    m = /^("?[A-Za-z0-9_.-]+"?)\s*=/.exec(trimmed);
    if (m) {
      const full = [...table, ...headerOf(m[1])];
      consider(full, i, line.indexOf(m[1]) + 1);
    }
  }
  return best ? { line: best.line, column: best.column } : undefined;

  function consider(keyPath: string[], lineIdx: number, column: number): void {
    // The longest prefix of the wanted path that this line defines is the most specific place to point at.
    let depth = 0;
    while (depth < keyPath.length && depth < want.length && keyPath[depth] === want[depth]) depth++;
    if (depth !== keyPath.length || depth === 0) return;
    if (!best || depth > best.depth) best = { line: lineIdx + 1, column, depth };
  }
}
