/**
 * Reading the framing of an Arrow IPC stream file without decoding its data, to find the complete messages
 * and the byte where a torn tail (a batch cut short by a crash) begins.
 *
 * Why the stream format: chain files grow while the run goes and must be readable at any moment, also
 * after a crash. The Arrow IPC *file* format ends with a footer that indexes the batches; until the footer
 * is written (at a clean close) no file reader can open it, and a crash loses the whole file to them. The
 * IPC *stream* format is a plain sequence of messages (schema, then record batches, then an optional
 * end-of-stream marker), each self-delimiting: an 8-byte prefix (0xFFFFFFFF and the metadata length), the
 * flatbuffer metadata, then the body whose length the metadata states. Appending a batch is appending bytes.
 * The Arrow columnar format specification ("IPC Streaming Format") lets a writer end a stream either with
 * the end-of-stream marker or by just closing it, so every conforming reader accepts a running file that
 * ends after its last complete batch (tests check apache-arrow in a separate process). A torn last batch
 * costs only that batch: readers that go batch by batch get every complete one before they report the
 * truncation; coeval's own reader ignores it, and a resumed run truncates it. Files carry the `.arrows`
 * extension that the specification recommends for streams.
 */
import { readSync } from 'node:fs';
import { Message, MessageHeader } from 'apache-arrow';
import { InputError } from '../core/errors.js';

export interface StreamMessage {
  /** Byte offset of the message's 8-byte prefix. */
  offset: number;
  /** Byte just past the message body. */
  end: number;
  kind: 'schema' | 'batch' | 'other';
  /** Rows in a record batch (0 for other messages). */
  rows: number;
}

export interface StreamScan {
  /** The complete messages, in order; the first is the schema. */
  messages: StreamMessage[];
  /** Byte just past the last complete message (where an appender continues). */
  dataEnd: number;
  /** Whether an end-of-stream marker follows the last message. */
  ended: boolean;
  /** Bytes after `dataEnd` that are neither a complete message nor the end marker (a torn tail). */
  tornBytes: number;
  fileSize: number;
}

const CONTINUATION = -1;

function readAt(fd: number, offset: number, length: number): Uint8Array {
  const buf = new Uint8Array(length);
  let got = 0;
  while (got < length) {
    const n = readSync(fd, buf, got, length - got, offset + got);
    if (n === 0) break;
    got += n;
  }
  return got === length ? buf : buf.subarray(0, got);
}

/** Scan the messages of the stream in `fd` (a file of `fileSize` bytes). Throws if no schema starts it. */
export function scanStream(fd: number, fileSize: number, file: string): StreamScan {
  const messages: StreamMessage[] = [];
  let offset = 0;
  let ended = false;
  while (offset + 8 <= fileSize) {
    const prefix = readAt(fd, offset, 8);
    const view = new DataView(prefix.buffer, prefix.byteOffset, 8);
    if (view.getInt32(0, true) !== CONTINUATION) break;
    const metadataLength = view.getInt32(4, true);
    if (metadataLength === 0) {
      ended = true;
      break;
    }
    if (metadataLength < 0 || offset + 8 + metadataLength > fileSize) break;
    let message: Message;
    try {
      message = Message.decode(readAt(fd, offset + 8, metadataLength));
    } catch {
      break;
    }
    const end = offset + 8 + metadataLength + Number(message.bodyLength);
    if (end > fileSize) break;
    const kind = message.headerType === MessageHeader.Schema ? 'schema' : message.headerType === MessageHeader.RecordBatch ? 'batch' : 'other';
    const rows = kind === 'batch' ? Number((message.header() as { length: number | bigint }).length) : 0;
    messages.push({ offset, end, kind, rows });
    offset = end;
  }
  if (messages.length === 0 || messages[0].kind !== 'schema') {
    throw new InputError('not an Arrow IPC stream (no schema message at the start)', {
      where: { file },
      expected: 'a chain file written by coeval (Arrow IPC stream format)',
      hint: fileSize < 8 ? 'the file is empty or was cut before its schema was written' : 'check that this is a coeval chain file',
    });
  }
  const dataEnd = offset;
  const tornBytes = ended ? 0 : fileSize - dataEnd;
  return { messages, dataEnd, ended, tornBytes, fileSize };
}

/** The bytes of messages [offset, end) of the file. */
export function readMessageBytes(fd: number, offset: number, end: number): Uint8Array {
  return readAt(fd, offset, end - offset);
}
