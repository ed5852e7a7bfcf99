// Reads a chain file with apache-arrow alone (no coeval code), as any Arrow user would, and prints what it
// found as JSON: schema metadata, field metadata, each complete batch's row count, per-column sums, and the
// error that ended the read, if any (a torn last batch). Usage: node readWithArrow.mjs FILE
import { readFileSync } from 'node:fs';
import process from 'node:process';
import { RecordBatchReader } from 'apache-arrow';

const bytes = readFileSync(process.argv[2]);
const reader = RecordBatchReader.from(bytes);
const out = { schemaMetadata: {}, fields: [], batches: [], sums: {}, rows: 0, error: null };
try {
  reader.open();
  out.schemaMetadata = Object.fromEntries(reader.schema.metadata);
  out.fields = reader.schema.fields.map((f) => ({ name: f.name, type: String(f.type), metadata: Object.fromEntries(f.metadata) }));
  for (const f of reader.schema.fields) out.sums[f.name] = 0;
  for (const batch of reader) {
    out.batches.push(batch.numRows);
    out.rows += batch.numRows;
    for (const f of reader.schema.fields) {
      const col = batch.getChild(f.name);
      for (let i = 0; i < batch.numRows; i++) out.sums[f.name] += Number(col.get(i));
    }
  }
} catch (err) {
  out.error = String(err.message ?? err);
}
process.stdout.write(JSON.stringify(out));
