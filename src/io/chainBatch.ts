/**
 * Encoding rows as Arrow record-batch messages, and decoding them back, with apache-arrow. A chain file is
 * the schema message followed by batch messages (see ipcStream.ts), so the writer needs the bytes of one
 * batch message at a time: apache-arrow's stream writer produces schema + batch + end marker, and the
 * schema and the marker are cut off (the schema's bytes are the same every time, which is checked).
 */
import { makeData, RecordBatch, RecordBatchReader, RecordBatchStreamWriter, Struct, type Schema } from 'apache-arrow';

/** The columns of a batch, in schema order: typed arrays of at least `rows` rows (booleans bit-packed). */
export type ColumnBuffers = (Int32Array | Int16Array | Float64Array | Uint8Array)[];

/** The bytes of the schema message alone. */
export function encodeSchema(schema: Schema): Uint8Array {
  const writer = new RecordBatchStreamWriter();
  writer.reset(undefined, schema);
  return writer.toUint8Array(true).slice();
}

/** The bytes of one record-batch message holding the first `rows` rows of `columns`. */
export function encodeBatch(schema: Schema, schemaBytes: Uint8Array, columns: ColumnBuffers, rows: number): Uint8Array {
  const children = schema.fields.map((field, i) => {
    const buf = columns[i];
    const data = buf instanceof Uint8Array ? buf.subarray(0, Math.ceil(rows / 8)) : buf.subarray(0, rows);
    return makeData({ type: field.type, length: rows, nullCount: 0, data } as Parameters<typeof makeData>[0]);
  });
  const batch = new RecordBatch(schema, makeData({ type: new Struct(schema.fields), length: rows, nullCount: 0, children }));
  const stream = RecordBatchStreamWriter.writeAll([batch]).toUint8Array(true);
  const head = stream.subarray(0, schemaBytes.length);
  for (let i = 0; i < schemaBytes.length; i++) {
    if (head[i] !== schemaBytes[i]) throw new Error('apache-arrow wrote a different schema message than expected');
  }
  // Drop the schema in front and the 8-byte end-of-stream marker behind.
  return stream.subarray(schemaBytes.length, stream.length - 8);
}

/** Decode one batch message (its bytes in `buffer` after the schema message's bytes). */
export function decodeBatch(buffer: Uint8Array): RecordBatch {
  const reader = RecordBatchReader.from(buffer);
  const result = reader.next();
  if (result.done || !result.value) throw new Error('no record batch in the message');
  return result.value;
}

/** The schema in a schema message's bytes. */
export function decodeSchema(schemaBytes: Uint8Array): Schema {
  const reader = RecordBatchReader.from(schemaBytes);
  reader.open();
  return reader.schema;
}
