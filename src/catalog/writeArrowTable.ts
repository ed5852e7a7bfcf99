/**
 * A table as an Arrow IPC file (with apache-arrow): doubles as float64, integers as int32, text as utf8.
 * Units and descriptions go in each field's metadata (`unit`, `description`), notes in the schema's
 * metadata (`coeval.<key>`).
 */
import { writeFileAtomic } from '../core/atomicWrite.js';
import type { OutputTable } from './outputTable.js';

export async function writeArrowTable(path: string, t: OutputTable): Promise<void> {
  const arrow = await import('apache-arrow');
  const vectors: Record<string, InstanceType<typeof arrow.Vector>> = {};
  for (const c of t.columns) {
    vectors[c.name] = c.values instanceof Float64Array || c.values instanceof Int32Array ? arrow.makeVector(c.values) : arrow.vectorFromArray(c.values as string[], new arrow.Utf8());
  }
  const table = new arrow.Table(vectors);
  // Field and schema metadata are plain Maps on the table's schema; fill them in place.
  t.columns.forEach((c, i) => {
    const meta = table.schema.fields[i].metadata;
    if (c.unit) meta.set('unit', c.unit);
    if (c.description) meta.set('description', c.description);
  });
  for (const [k, v] of t.notes) table.schema.metadata.set(`coeval.${k}`, v);
  writeFileAtomic(path, arrow.tableToIPC(table, 'file'));
}
