/**
 * Splits delimited text into records and fields, working on bytes so that a large file is scanned once,
 * in chunks, and only the cells that are wanted are ever turned into strings.
 *
 * Handles: one-byte delimiters or runs of blanks (`whitespace`); fields in double quotes, with `""` for a
 * quote inside and delimiters or line breaks inside; LF, CRLF and lone CR line ends; comment lines
 * (a prefix after optional blanks); blank lines. A generic CSV library would do most of this, but it
 * would not give the byte positions we need to report file:line:column, nor skip materialising unwanted
 * cells, nor know comment prefixes or whitespace-aligned tables; hence this small scanner.
 */

const QUOTE = 0x22;
const LF = 0x0a;
const CR = 0x0d;
const SPACE = 0x20;
const TAB = 0x09;
/** Powers of ten that are exact doubles (10^0 .. 10^22), parsed rather than computed so each is exact. */
const POW10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/** A delimiter byte, or `whitespace` for runs of blanks and tabs. */
export type Separator = number | 'whitespace';

export class RecordScanner {
  /** Bytes being scanned: the unread rest of the previous chunk followed by the current one. */
  buf: Buffer = Buffer.alloc(0);
  /** File offset (in content bytes) of buf[0]. */
  bufOffset = 0;
  pos = 0;
  /** Line number (1-based) at `pos`. */
  line = 1;

  /** Fields of the last record: byte ranges in `buf` (quotes excluded) and whether `""` escapes occur. */
  starts = new Int32Array(64);
  ends = new Int32Array(64);
  escaped = new Uint8Array(64);
  nFields = 0;
  /** Where the last record began: index in buf, and its line. */
  recordStart = 0;
  recordLine = 1;
  /** The last comment line's text (prefix removed), for headers written as comments. */
  lastComment: string | undefined;

  private readonly sep: Separator;
  private readonly comment: Buffer;

  constructor(sep: Separator, comment: string) {
    this.sep = sep;
    this.comment = Buffer.from(comment, 'utf8');
  }

  /** Append a chunk, keeping the unread part of the current buffer. */
  push(chunk: Buffer): void {
    if (this.pos >= this.buf.length) {
      this.bufOffset += this.buf.length;
      this.buf = chunk;
    } else {
      const rest = this.buf.subarray(this.pos);
      this.bufOffset += this.pos;
      this.buf = rest.length === 0 ? chunk : Buffer.concat([rest, chunk]);
    }
    this.pos = 0;
  }

  /**
   * Scan the next record (skipping comment and blank lines). Returns true when a whole record was found,
   * false when more input is needed (`final` = false) or the input is exhausted (`final` = true).
   */
  next(final: boolean): boolean {
    for (;;) {
      const r = this.scanOne(final);
      if (r === 'record') return true;
      if (r === 'more') return false;
      // 'skip': a comment or blank line was consumed; go on.
    }
  }

  private scanOne(final: boolean): 'record' | 'more' | 'skip' {
    const buf = this.buf;
    const n = buf.length;
    const ws = this.sep === 'whitespace';
    const delim = ws ? -1 : (this.sep as number);
    let i = this.pos;
    let line = this.line;
    if (i >= n) return 'more';

    // Leading blanks, then: a comment, a blank line, or a record.
    let j = i;
    while (j < n && (buf[j] === SPACE || (buf[j] === TAB && delim !== TAB))) j++;
    if (j >= n && !final) return 'more';
    if (this.comment.length > 0 && startsWith(buf, j, this.comment)) {
      const eol = findEol(buf, j);
      if (eol < 0 && !final) return 'more';
      const end = eol < 0 ? n : eol;
      const after = eol < 0 ? n : skipEol(buf, eol);
      if (after < 0 && !final) return 'more';
      this.lastComment = buf.toString('utf8', j + this.comment.length, end).trim();
      this.pos = after < 0 ? n : after;
      this.line = line + 1;
      return 'skip';
    }
    if (j >= n || buf[j] === LF || buf[j] === CR) {
      if (j >= n) {
        this.pos = n; // only blanks remain at the end of the input
        return 'more';
      }
      const after = skipEol(buf, j);
      if (after < 0 && !final) return 'more';
      this.pos = after < 0 ? n : after;
      this.line = line + 1;
      return 'skip';
    }

    this.recordStart = i;
    this.recordLine = line;
    let nf = 0;
    if (ws) i = j;
    for (;;) {
      if (nf === this.starts.length) this.grow();
      // Field start. A quote may follow blanks (`a, "b"`).
      let k = i;
      while (k < n && (buf[k] === SPACE || (buf[k] === TAB && delim !== TAB))) k++;
      let fieldEnd: number;
      if (k < n && buf[k] === QUOTE) {
        let q = k + 1;
        let esc = 0;
        let innerLines = 0;
        for (;;) {
          if (q >= n) {
            if (!final) return 'more';
            break; // unterminated quote at end of input: take what there is
          }
          const b = buf[q];
          if (b === QUOTE) {
            if (q + 1 < n && buf[q + 1] === QUOTE) {
              esc = 1;
              q += 2;
              continue;
            }
            if (q + 1 >= n && !final) return 'more';
            break;
          }
          if (b === LF) innerLines++;
          q++;
        }
        this.starts[nf] = k + 1;
        this.ends[nf] = Math.min(q, n);
        this.escaped[nf] = esc;
        line += innerLines;
        i = q + 1;
        // Anything between the closing quote and the next separator is ignored.
        while (i < n && buf[i] !== LF && buf[i] !== CR && (ws ? buf[i] !== SPACE && buf[i] !== TAB : buf[i] !== delim)) i++;
        fieldEnd = i;
      } else {
        if (ws) {
          while (i < n && buf[i] !== SPACE && buf[i] !== TAB && buf[i] !== LF && buf[i] !== CR) i++;
        } else {
          while (i < n && buf[i] !== delim && buf[i] !== LF && buf[i] !== CR) i++;
        }
        this.starts[nf] = k <= i ? k : i;
        this.ends[nf] = i;
        this.escaped[nf] = 0;
        fieldEnd = i;
      }
      nf++;
      i = fieldEnd;
      if (i >= n) {
        if (!final) return 'more';
        this.finish(nf, n, line + 1);
        return 'record';
      }
      const b = buf[i];
      if (b === LF || b === CR) {
        const after = skipEol(buf, i);
        if (after < 0 && !final) return 'more';
        this.finish(nf, after < 0 ? n : after, line + 1);
        return 'record';
      }
      if (ws) {
        // Runs of blanks separate fields; blanks before the line end do not start one.
        while (i < n && (buf[i] === SPACE || buf[i] === TAB)) i++;
        if (i >= n) {
          if (!final) return 'more';
          this.finish(nf, n, line + 1);
          return 'record';
        }
        if (buf[i] === LF || buf[i] === CR) {
          const after = skipEol(buf, i);
          if (after < 0 && !final) return 'more';
          this.finish(nf, after < 0 ? n : after, line + 1);
          return 'record';
        }
      } else {
        i++; // past the delimiter
        if (i >= n && !final) return 'more';
      }
    }
  }

  private finish(nf: number, next: number, line: number): void {
    this.nFields = nf;
    this.pos = next;
    this.line = line;
  }

  private grow(): void {
    const m = this.starts.length * 2;
    const s = new Int32Array(m);
    s.set(this.starts);
    const e = new Int32Array(m);
    e.set(this.ends);
    const x = new Uint8Array(m);
    x.set(this.escaped);
    this.starts = s;
    this.ends = e;
    this.escaped = x;
  }

  /** Field f of the last record as text (trimmed; quotes removed). */
  text(f: number): string {
    const s = this.buf.toString('utf8', this.starts[f], this.ends[f]);
    const t = this.escaped[f] ? s.replace(/""/g, '"') : s;
    return t.trim();
  }

  /** Field f as text for number parsing: ASCII is enough, and latin1 decoding is faster. */
  asciiText(f: number): string {
    if (this.escaped[f]) return this.text(f);
    return this.buf.toString('latin1', this.starts[f], this.ends[f]);
  }

  /**
   * Field f as a number, straight from the bytes for plain decimals (`-12.345`): with at most 15
   * significant digits the digits form an exact integer m < 2^53, and for k <= 22 fraction digits m / 10^k
   * is one correctly rounded division of two exact doubles, so the result equals Number()'s (Clinger 1990,
   * "How to read floating point numbers accurately", the fast path). Anything else returns undefined and
   * goes through the general text path.
   */
  fastNumber(f: number): number | undefined {
    const buf = this.buf;
    let i = this.starts[f];
    let end = this.ends[f];
    while (i < end && (buf[i] === SPACE || buf[i] === TAB)) i++;
    while (end > i && (buf[end - 1] === SPACE || buf[end - 1] === TAB)) end--;
    if (i === end || this.escaped[f]) return undefined;
    let neg = false;
    if (buf[i] === 0x2d) {
      neg = true;
      i++;
    } else if (buf[i] === 0x2b) i++;
    let m = 0;
    let seen = 0;
    let digits = 0;
    let frac = 0;
    let dot = false;
    for (; i < end; i++) {
      const c = buf[i];
      if (c >= 0x30 && c <= 0x39) {
        seen++;
        if (m !== 0 || c !== 0x30) digits++;
        m = m * 10 + (c - 0x30);
        if (dot) frac++;
      } else if (c === 0x2e && !dot) dot = true;
      else return undefined;
    }
    if (seen === 0 || digits > 15 || frac > 22) return undefined;
    const v = frac === 0 ? m : m / POW10[frac];
    return neg ? -v : v;
  }

  /** 1-based character column of field f of the last record (blanks before it skipped). */
  columnOf(f: number): number {
    let lineStart = this.starts[f];
    while (lineStart > 0 && this.buf[lineStart - 1] !== LF && this.buf[lineStart - 1] !== CR) lineStart--;
    let s = this.starts[f];
    while (s < this.ends[f] && (this.buf[s] === SPACE || this.buf[s] === TAB)) s++;
    const quoted = this.starts[f] > 0 && this.buf[this.starts[f] - 1] === QUOTE;
    const prefix = this.buf.toString('utf8', lineStart, quoted ? this.starts[f] - 1 : s).replace(/^\uFEFF/, '');
    return prefix.length + 1;
  }

  /** File offset (content bytes) where the last record began. */
  recordOffset(): number {
    return this.bufOffset + this.recordStart;
  }
}

function startsWith(buf: Buffer, at: number, prefix: Buffer): boolean {
  if (at + prefix.length > buf.length) return false;
  for (let k = 0; k < prefix.length; k++) if (buf[at + k] !== prefix[k]) return false;
  return true;
}

function findEol(buf: Buffer, from: number): number {
  for (let k = from; k < buf.length; k++) if (buf[k] === LF || buf[k] === CR) return k;
  return -1;
}

/** Index after the line end at `at`, or -1 when a CR is the last byte (a LF may follow in the next chunk). */
function skipEol(buf: Buffer, at: number): number {
  if (buf[at] === LF) return at + 1;
  if (at + 1 >= buf.length) return -1;
  return buf[at + 1] === LF ? at + 2 : at + 1;
}
