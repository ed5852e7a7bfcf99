/**
 * FITS and VOTable details beyond the cross-format table: HDU and TABLE selection, the hints that name
 * the right one, gzip, type mismatches, and VOTable null conventions (IVOA VOTable 1.4, section 6:
 * VALUES/@null for integers, an empty TD for any type; hexadecimal integers in TABLEDATA; archives report
 * failed queries with INFO name="QUERY_STATUS" value="ERROR").
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { readTable, type ColumnRequest, type TableRequest } from '../../src/catalog/index.js';
import { InputError } from '../../src/core/errors.js';
import { REPO_ROOT } from '../helpers/cli.js';

const FIXTURES = resolve(REPO_ROOT, 'tests/fixtures/catalog');
const dir = mkdtempSync(join(tmpdir(), 'coeval-fv-'));
let n = 0;
function file(content: string | Buffer, ext: string): string {
  const p = join(dir, `f${n++}${ext}`);
  writeFileSync(p, content);
  return p;
}
const num = (name: string): ColumnRequest => ({ name, kind: 'number', role: 'test', key: `test.${name}` });
const txt = (name: string): ColumnRequest => ({ name, kind: 'text', role: 'test', key: `test.${name}` });
const req = (columns: ColumnRequest[], extra: Partial<TableRequest> = {}): TableRequest => ({ columns, comment: '#', ...extra });
async function inputError(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}
const gaia = (name: string): string => join(FIXTURES, name);
const json = JSON.parse(readFileSync(gaia('gaia_like.json'), 'utf8')) as { columns: { name: string; values: unknown[] }[] };
const values = (name: string): unknown[] => json.columns.find((c) => c.name === name)?.values ?? [];

describe('FITS binary tables', () => {
  it('reads the unsigned 16-bit convention (TZERO = 32768, FITS Standard 4.0 section 7.3.2)', async () => {
    const t = await readTable(gaia('gaia_like.fits'), 'fits', req([num('n_obs')]));
    expect(Array.from(t.numbers.get('n_obs') as Float64Array)).toEqual(values('n_obs'));
    expect(t.hdu).toBe(1);
    expect(t.units.get('parallax')).toBe('mas');
  });

  it('reads a logical column as 1/0 and a character column as trimmed text', async () => {
    const t = await readTable(gaia('gaia_like.fits'), 'fits', req([num('dup_flag'), txt('quality')]));
    expect(Array.from(t.numbers.get('dup_flag') as Float64Array)).toEqual(values('dup_flag').map(Number));
    expect(t.texts.get('quality')).toEqual(values('quality'));
  });

  it('reads a gzipped FITS file', async () => {
    const p = file(gzipSync(readFileSync(gaia('gaia_like.fits'))), '.fits.gz');
    const t = await readTable(p, 'fits', req([txt('source_id')]));
    expect(t.texts.get('source_id')).toEqual(values('source_id'));
  });

  it('names the binary tables when the chosen HDU is not one', async () => {
    const e = await inputError(readTable(gaia('gaia_like.fits'), 'fits', req([num('parallax')], { hdu: 0 })));
    expect(e.message).toMatch(/HDU 0 is the primary HDU, not a binary table/);
    expect(e.hint).toMatch(/catalogue\.hdu = 1 \(HDU 1: a BINTABLE "STARS" of 40 rows\)/);
  });

  it('says there is no such HDU', async () => {
    const e = await inputError(readTable(gaia('gaia_like.fits'), 'fits', req([num('parallax')], { hdu: 5 })));
    expect(e.message).toMatch(/no HDU 5/);
  });

  it('refuses a text column mapped as numbers, naming its TFORM', async () => {
    const e = await inputError(readTable(gaia('gaia_like.fits'), 'fits', req([num('quality')])));
    expect(e.message).toMatch(/holds text \(TFORM = '8A'\)/);
    expect(e.where).toMatchObject({ hdu: 1, field: 'quality' });
  });

  it('locates a value by HDU, row and column', async () => {
    const t = await readTable(gaia('gaia_like.fits'), 'fits', req([num('parallax')]));
    expect(t.locate(4, 'parallax')).toEqual({ file: gaia('gaia_like.fits'), hdu: 1, row: 5, field: 'parallax' });
  });

  it('refuses a file that is not FITS although asked to read it as FITS', async () => {
    const e = await inputError(readTable(gaia('gaia_like.csv'), 'fits', req([num('parallax')])));
    expect(e.message).toMatch(/does not begin with SIMPLE = T/);
  });
});

const VOT = (body: string, fields = '<FIELD name="id" datatype="long"/><FIELD name="V" datatype="double"/><FIELD name="n" datatype="int"><VALUES null="-1"/></FIELD>') =>
  `<?xml version="1.0"?>\n<VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">\n<RESOURCE><TABLE>${fields}\n<DATA><TABLEDATA>\n${body}\n</TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>\n`;

describe('VOTable', () => {
  it('applies VALUES null to integers, reads empty cells as null and hexadecimal integers', async () => {
    const p = file(VOT('<TR><TD>1</TD><TD>15.5</TD><TD>-1</TD></TR>\n<TR><TD>2</TD><TD/><TD>0x1F</TD></TR>\n<TR><TD>3</TD><TD>NaN</TD></TR>'), '.vot');
    const t = await readTable(p, 'votable', req([num('V'), num('n'), txt('id')]));
    expect(Array.from(t.numbers.get('V') as Float64Array)).toEqual([15.5, NaN, NaN]);
    // Row 3 ends early: its missing trailing cells are null.
    expect(Array.from(t.numbers.get('n') as Float64Array)).toEqual([NaN, 31, NaN]);
    expect(t.texts.get('id')).toEqual(['1', '2', '3']);
    expect(t.locate(1, 'V')).toMatchObject({ line: 6, row: 2 });
  });

  it('reports a non-number in TABLEDATA with line and column', async () => {
    const p = file(VOT('<TR><TD>1</TD><TD>15.5</TD><TD>3</TD></TR>\n<TR><TD>2</TD><TD>bright</TD><TD>4</TD></TR>'), '.vot');
    const e = await inputError(readTable(p, 'votable', req([num('V')])));
    expect(e.where).toMatchObject({ line: 6, row: 2, field: 'V' });
    expect(e.found).toBe('bright');
  });

  it('picks a TABLE by index and says how many there are', async () => {
    const two = VOT('<TR><TD>1</TD><TD>15.5</TD><TD>3</TD></TR>').replace('</RESOURCE>', '<TABLE><FIELD name="W" datatype="float"/><DATA><TABLEDATA><TR><TD>2.5</TD></TR></TABLEDATA></DATA></TABLE></RESOURCE>');
    const p = file(two, '.vot');
    const t = await readTable(p, 'votable', req([num('W')], { table: 1 }));
    expect(Array.from(t.numbers.get('W') as Float64Array)).toEqual([2.5]);
    const e = await inputError(readTable(p, 'votable', req([num('W')], { table: 2 })));
    expect(e.message).toMatch(/has 2 TABLE\(s\), so there is no table 2/);
  });

  it("reports an archive's error response instead of a missing table", async () => {
    const p = file('<?xml version="1.0"?><VOTABLE version="1.4"><RESOURCE type="results"><INFO name="QUERY_STATUS" value="ERROR">column phot_x does not exist</INFO></RESOURCE></VOTABLE>', '.vot');
    const e = await inputError(readTable(p, 'votable', req([num('V')])));
    expect(e.message).toMatch(/archive returned an error/);
    expect(e.found).toBe('column phot_x does not exist');
  });

  it('reads a gzipped BINARY2 VOTable', async () => {
    const p = file(gzipSync(readFileSync(gaia('gaia_like_binary2.vot'))), '.vot.gz');
    const t = await readTable(p, 'votable', req([txt('source_id'), num('n_obs')]));
    expect(t.texts.get('source_id')).toEqual(values('source_id'));
    expect(Array.from(t.numbers.get('n_obs') as Float64Array)).toEqual(values('n_obs'));
  });

  it('refuses a text FIELD mapped as numbers', async () => {
    const e = await inputError(readTable(gaia('gaia_like_tabledata.vot'), 'votable', req([num('quality')])));
    expect(e.message).toMatch(/holds text \(datatype unicodeChar\)/);
  });
});

describe('Arrow and Parquet', () => {
  it('refuses a text column mapped as numbers, naming the Arrow type', async () => {
    const e = await inputError(readTable(gaia('gaia_like.arrow'), 'arrow', req([num('quality')])));
    expect(e.message).toMatch(/Arrow type Utf8/);
  });

  it('refuses a Parquet string column mapped as numbers', async () => {
    const e = await inputError(readTable(gaia('gaia_like.parquet'), 'parquet', req([num('quality')])));
    expect(e.message).toMatch(/Parquet type UTF8/);
  });

  it('says a truncated Parquet file cannot be read', async () => {
    const b = readFileSync(gaia('gaia_like.parquet'));
    const e = await inputError(readTable(file(b.subarray(0, b.length - 100), '.parquet'), 'parquet', req([num('parallax')])));
    expect(e.message).toMatch(/could not be read/);
  });
});
