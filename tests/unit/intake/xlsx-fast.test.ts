/**
 * The fast .xlsx reader of the parse worker (server/intake/xlsx-fast.mjs) against xlsx itself: for
 * every workbook it reads, the first sheet's range, full range and cells must be exactly what
 * `XLSX.read` (the worker's options) then `sheet_to_json(header: 1, raw, defval: null, blankrows)`
 * give; for a workbook it does not handle it must answer undefined, so the worker uses xlsx.
 */
import { crc32, deflateRawSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { DEFAULT_PARSE_LIMITS, parseSpreadsheet } from '../../../server/intake/parse.js';
import { PartTooLargeError, readPlainXlsx, xlsxReadOptions } from '../../../server/intake/xlsx-fast.mjs';

const MAX_PART = 100 * 1024 * 1024;

function viaXlsx(bytes: Buffer, sheetRows: number) {
  const book = XLSX.read(bytes, xlsxReadOptions(sheetRows) as XLSX.ParsingOptions);
  const sheetName = book.SheetNames[0] as string;
  const sheet = book.Sheets[sheetName] as XLSX.WorkSheet;
  if (!sheet['!ref']) return { sheetName, ref: undefined, fullref: undefined, table: [] };
  return {
    sheetName,
    ref: XLSX.utils.decode_range(sheet['!ref']),
    fullref: XLSX.utils.decode_range((sheet['!fullref'] as string | undefined) ?? sheet['!ref']),
    table: XLSX.utils.sheet_to_json(sheet, { header: 1, raw: true, defval: null, blankrows: true }),
  };
}

/** The fast reading, its table laid out (the worker asks for it only once the range has passed its checks). */
function fast(bytes: Buffer, sheetRows: number) {
  const read = readPlainXlsx(new Uint8Array(bytes), { sheetRows, maxPartBytes: MAX_PART });
  return read && { ...read, table: read.table() };
}

function written(rows: unknown[][], options: XLSX.WritingOptions = {}, change?: (sheet: XLSX.WorkSheet) => void): Buffer {
  const book = XLSX.utils.book_new();
  const sheet = XLSX.utils.aoa_to_sheet(rows);
  change?.(sheet);
  XLSX.utils.book_append_sheet(book, sheet, 'Mötors & <co>');
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet([['second sheet']]), 'Second');
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true, ...options }) as Buffer;
}

/** A ZIP (deflated entries) of the given parts, for hand-written workbooks. */
function zip(parts: Record<string, string>): Buffer {
  const locals: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const [name, text] of Object.entries(parts)) {
    const data = Buffer.from(text, 'utf8');
    const packed = deflateRawSync(data);
    const nameBytes = Buffer.from(name);
    // The 26 bytes a local header (at 4) and its central-directory entry (at 6) share: version needed,
    // flags, method, time, date, CRC-32, compressed and plain sizes, name length, extra length.
    const shared = Buffer.alloc(26);
    shared.writeUInt16LE(20, 0);
    shared.writeUInt16LE(8, 4);
    shared.writeUInt32LE(crc32(data), 10);
    shared.writeUInt32LE(packed.length, 14);
    shared.writeUInt32LE(data.length, 18);
    shared.writeUInt16LE(nameBytes.length, 22);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    shared.copy(local, 4);
    const entry = Buffer.alloc(46);
    entry.writeUInt32LE(0x02014b50, 0);
    entry.writeUInt16LE(20, 4);
    shared.copy(entry, 6);
    entry.writeUInt32LE(offset, 42);
    locals.push(local, nameBytes, packed);
    central.push(entry, nameBytes);
    offset += 30 + nameBytes.length + packed.length;
  }
  const directory = Buffer.concat(central);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(central.length / 2, 8);
  end.writeUInt16LE(central.length / 2, 10);
  end.writeUInt32LE(directory.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, directory, end]);
}

const MAIN = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const RELATIONSHIPS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
function handWritten(sheetData: string, dimension = '<dimension ref="A1:D6"/>', sharedStrings = SHARED_STRINGS, moreRelationships = ''): Buffer {
  return zip({
    '[Content_Types].xml': `<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/><Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/></Types>`,
    '_rels/.rels': `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RELATIONSHIPS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    'xl/workbook.xml': `<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="${MAIN}" xmlns:r="${RELATIONSHIPS}"><sheets><sheet name="Motors &amp; more" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    'xl/_rels/workbook.xml.rels': `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RELATIONSHIPS}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${RELATIONSHIPS}/sharedStrings" Target="/xl/sharedStrings.xml"/>${moreRelationships}</Relationships>`,
    'xl/worksheets/sheet1.xml': `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="${MAIN}">${dimension}<sheetData>${sheetData}</sheetData></worksheet>`,
    'xl/sharedStrings.xml': sharedStrings,
  });
}
// Plain, rich (runs), with a phonetic run, entities and an _xHHHH_ escape, an empty <t/>.
const SHARED_STRINGS = `<?xml version="1.0" encoding="UTF-8"?><sst xmlns="${MAIN}" count="5" uniqueCount="5"><si><t>Tag</t></si><si><r><rPr><b/></rPr><t>Rated </t></r><r><t xml:space="preserve">power (kW)</t></r></si><si><t xml:space="preserve">  M-1 &amp; &lt;x&gt; _x000D_ &#233;</t><rPh sb="0" eb="1"><t>ph</t></rPh></si><si><r><t>A</t></r><rPh sb="0" eb="1"><t>zz</t></rPh><r><t>B</t></r></si><si><t/></si></sst>`;
// Shared and inline strings, numbers, booleans, errors, a formula with and without its cached value,
// an empty <v>, a styled empty cell, a skipped row and an empty row.
const CELLS = `<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="s"><v>1</v></c><c r="C1" t="inlineStr"><is><t>Inline &amp; co</t></is></c></row>
<row r="3" spans="1:4"><c r="A3" t="s" s="1"><v>2</v></c><c r="B3"><v>7.5</v></c><c r="C3" t="inlineStr"><is><r><t>ri</t></r><r><t>ch</t></r></is></c><c r="D3" t="b"><v>1</v></c></row>
<row r="4"><c r="A4" t="s"><v>3</v></c><c r="B4" s="2"/><c r="C4" t="e"><v>#N/A</v></c><c r="D4" t="str"><f>1+1</f><v>two</v></c></row>
<row r="5"><c r="A5" t="s"><v>4</v></c><c r="B5"><f>B3*2</f><v>15</v></c><c r="C5" t="n"><v></v></c><c r="D5" t="e"><v>#NULL!</v></c></row>
<row r="6"/>`;

describe('the fast .xlsx reader reads exactly what xlsx reads', () => {
  const messy = [
    ['Plant motor list — Ünits & "quotes"'],
    [],
    ['Tag', 'Power (kW)', 'Speed', 'Ok?', 'Note'],
    ['M-1', '7,5 kW', 1460, true, '<b>&amp; _x0041_'],
    [null, null, null, null, null],
    ['M-2', 11, '2950 rpm', false, '  spaced  '],
    ['M-3', 1e-7, -3.25, null, '=SUM(A1)'],
    ['Ω-4', 15, null, null, 'multi\nline'],
  ];
  const workbooks: Array<[string, Buffer]> = [
    ['written by xlsx, inline text', written(messy)],
    ['written by xlsx, shared strings', written(messy, { bookSST: true })],
    [
      'with formulas and errors',
      written(messy, { bookSST: true }, (sheet) => {
        sheet.B9 = { t: 'n', v: 26, f: 'B4+B6' };
        sheet.C9 = { t: 'e', v: 0x07 };
        sheet.D9 = { t: 's', v: 'text result', f: 'A1&""' };
        sheet['!ref'] = 'A1:E9';
      }),
    ],
    ['whose range starts at B3', written(messy, {}, (sheet) => void (sheet['!ref'] = 'B3:E8'))],
    ['hand-written: rich text, phonetic runs, inline strings, booleans, errors', handWritten(CELLS)],
    ['hand-written without a dimension', handWritten(CELLS, '')],
    ['hand-written with a dimension smaller than the data', handWritten(CELLS, '<dimension ref="A1:B3"/>')],
    ['hand-written with a one-cell dimension', handWritten(CELLS, '<dimension ref="A1"/>')],
    ['hand-written without cell and row references', handWritten('<row><c t="s"><v>0</v></c><c><v>1</v></c></row><row><c/><c t="str"><v>x</v></c></row>', '')],
    ['hand-written with an empty sheet', handWritten('', '')],
  ];
  for (const [name, bytes] of workbooks) {
    it(`${name} (all rows, and cut by sheetRows)`, () => {
      for (const sheetRows of [100_101, 4]) {
        const read = fast(bytes, sheetRows);
        expect(read).toBeDefined();
        expect(read).toEqual(viaXlsx(bytes, sheetRows));
      }
    });
  }

  it('leaves to xlsx what it does not handle: date cells, prefixed elements, other files', () => {
    expect(fast(handWritten('<row r="1"><c r="A1" t="d"><v>2020-02-01T00:00:00Z</v></c></row>', ''), 100)).toBeUndefined();
    expect(fast(handWritten('<row r="1"><x:c r="A1"><v>1</v></x:c></row>', ''), 100)).toBeUndefined();
    expect(fast(handWritten('<row r="2"><c r="A1"><v>1</v></c></row>', ''), 100)).toBeUndefined(); // a cell outside its row
    expect(fast(handWritten('<row r="1"><c r="A1" t="s"><v>9</v></c></row>', ''), 100)).toBeUndefined(); // no such shared string
    expect(fast(Buffer.from('PK\u0003\u0004 not really a zip'), 100)).toBeUndefined();
    expect(fast(zip({ 'word/document.xml': '<w:document/>' }), 100)).toBeUndefined();
  });

  it('refuses to inflate a part beyond its limit, whatever the archive declares', () => {
    const bytes = handWritten(`<row r="1"><c r="A1" t="inlineStr"><is><t>${'x'.repeat(200_000)}</t></is></c></row>`, '');
    expect(() => readPlainXlsx(new Uint8Array(bytes), { sheetRows: 100, maxPartBytes: 100_000 })).toThrow(RangeError);
    expect(() => readPlainXlsx(new Uint8Array(bytes), { sheetRows: 100, maxPartBytes: 100_000 })).toThrow(new PartTooLargeError('xl/worksheets/sheet1.xml', 100_000));
  });

  it('makes the worker refuse a ZIP that neither reader can read, in words with xlsx’s reason', async () => {
    await expect(parseSpreadsheet(zip({ 'word/document.xml': '<w:document/>' }))).rejects.toMatchObject({
      status: 400,
      message: 'The file cannot be read as a spreadsheet (Unsupported ZIP file).',
    });
  });

  it('makes the worker refuse a part that inflates past its limit while its directory declares it small, without handing it to xlsx', async () => {
    const bytes = handWritten(`<row r="1"><c r="A1" t="inlineStr"><is><t>${'x'.repeat(2 * 1048576)}</t></is></c></row>`, '');
    // The directory declares the 2 MB sheet as 1 kB, so the worker's check of declared sizes passes it.
    // Its name's last occurrence is in the central directory, which follows the parts.
    const entry = bytes.lastIndexOf('xl/worksheets/sheet1.xml') - 46;
    expect(bytes.readUInt32LE(entry)).toBe(0x02014b50);
    bytes.writeUInt32LE(1024, entry + 24);
    await expect(parseSpreadsheet(bytes, { ...DEFAULT_PARSE_LIMITS, maxPartBytes: 1048576 })).rejects.toMatchObject({
      status: 413,
      message: 'The workbook expands to more than its ZIP directory declares (xl/worksheets/sheet1.xml: over 1 MB); at most 1 MB per part can be imported. Save only the motor list, or split it.',
    });
  });

  it('answers the range of a declared 16,384-column sheet without laying out its cells, so the worker can refuse it', () => {
    const rows = Array.from({ length: 20_000 }, (_, index) => `<row r="${index + 1}"><c r="A${index + 1}"><v>${index}</v></c></row>`).join('');
    const read = readPlainXlsx(new Uint8Array(handWritten(rows, '<dimension ref="A1:XFD20000"/>')), { sheetRows: 100_101, maxPartBytes: MAX_PART });
    expect(read?.ref).toEqual({ s: { r: 0, c: 0 }, e: { r: 19_999, c: 16_383 } });
    expect(typeof read?.table).toBe('function');
  });

  it('scans 200,000 unclosed relationship tags in linear time', () => {
    const bytes = handWritten(CELLS, undefined, undefined, '<Relationships><Relationship\n'.repeat(200_000));
    expect(fast(bytes, 100)).toEqual(fast(handWritten(CELLS), 100));
  });

  it('reads 50,000 rows without references followed by 50,000 empty rows, and a 20,000-run string', () => {
    const rows = Array.from({ length: 50_000 }, (_, index) => `<row><c t="s"><v>0</v></c><c><v>${index}</v></c><c s="1"></c><c s="2"/></row>`).join('');
    const rich = `<si><r><t>x</t></r>${'<r><t>y</t></r>'.repeat(20_000)}</si>`;
    const bytes = handWritten(rows + '<row ht="20" customHeight="1"></row>'.repeat(50_000), '', SHARED_STRINGS.replace('<si><t>Tag</t></si>', rich));
    const read = fast(bytes, 200_000);
    expect(read?.table).toHaveLength(100_000);
    // Cells without a value do not widen the range: two columns.
    expect(read?.table[49_999]).toEqual([`x${'y'.repeat(20_000)}`, 49_999]);
    expect(read).toEqual(viaXlsx(bytes, 200_000));
  });
});
