import { InputError } from '../core/errors.js';
import { sniffContent } from './openBytes.js';
import type { CatalogFormat } from './types.js';

type Sniffed = CatalogFormat | 'text';

/** What the first bytes say. Content beats the file name: a VOTable saved as `result.csv` is still XML. */
function sniff(head: Buffer): Sniffed | undefined {
  const ascii = head.toString('latin1', 0, Math.min(head.length, 1024)).replace(/^\uFEFF|^\xEF\xBB\xBF/, '');
  if (ascii.startsWith('SIMPLE  =')) return 'fits';
  if (ascii.startsWith('ARROW1')) return 'arrow';
  if (head.length >= 8 && head.readUInt32LE(0) === 0xffffffff) return 'arrow'; // IPC stream: continuation marker
  if (ascii.startsWith('PAR1')) return 'parquet';
  if (/^\s*# %ECSV/.test(ascii)) return 'ecsv';
  if (/^\s*</.test(ascii)) return /<VOTABLE/i.test(head.toString('latin1')) ? 'votable' : undefined;
  if (head.includes(0)) return undefined; // binary, and none of the above
  return 'text';
}

function byExtension(path: string): CatalogFormat | undefined {
  const p = path.toLowerCase().replace(/\.(gz|gzip)$/, '');
  const ext = p.slice(p.lastIndexOf('.') + 1);
  const map: Record<string, CatalogFormat> = {
    csv: 'csv', tsv: 'tsv', tab: 'tsv', txt: 'whitespace', dat: 'whitespace', ecsv: 'ecsv',
    fits: 'fits', fit: 'fits', fts: 'fits', vot: 'votable', votable: 'votable', xml: 'votable',
    arrow: 'arrow', arrows: 'arrow', feather: 'arrow', ipc: 'arrow', parquet: 'parquet', pq: 'parquet',
  };
  return map[ext];
}

const BINARY: ReadonlySet<CatalogFormat> = new Set(['fits', 'votable', 'arrow', 'parquet', 'ecsv']);

/**
 * The format to read `path` as. `auto` sniffs the content, then falls back on the file name. An explicit
 * format that the content plainly contradicts (FITS asked for, XML found) is an error that names both,
 * rather than a confusing failure deep in the wrong reader.
 */
export function detectFormat(path: string, requested: CatalogFormat | 'auto'): CatalogFormat {
  const head = sniffContent(path, 4096);
  const found = sniff(head);
  if (requested !== 'auto') {
    const contradicts = found !== undefined && found !== 'text' && found !== requested && !(found === 'ecsv' && ['csv', 'whitespace'].includes(requested));
    const textAsBinary = found === 'text' && BINARY.has(requested) && requested !== 'ecsv';
    if (contradicts || textAsBinary) {
      throw new InputError(`the file was to be read as ${requested}, but its first bytes look like ${found === 'text' ? 'plain text' : found}`, {
        where: { file: path, key: 'catalogue.format' },
        found: head.toString('latin1', 0, 16),
        hint: `set catalogue.format = "${found === 'text' ? 'auto' : found}" (or "auto")`,
      });
    }
    return requested;
  }
  if (found !== undefined && found !== 'text') return found;
  const ext = byExtension(path);
  if (found === 'text') return ext && !BINARY.has(ext) ? ext : 'csv';
  if (ext) return ext;
  throw new InputError('could not tell the format of the file', {
    where: { file: path },
    found: head.toString('latin1', 0, 16),
    expected: 'CSV, TSV or whitespace text, ECSV, FITS, VOTable, Arrow IPC or Parquet',
    hint: 'set catalogue.format to the format of the file',
  });
}
