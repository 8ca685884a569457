/**
 * A fast reader for the plain .xlsx files most motor lists are: the first sheet's cell values, as
 * `XLSX.read` (dense, raw, no formulas, no styles, `sheetRows`) then `sheet_to_json(header: 1, raw,
 * defval: null, blankrows)` give them, in a fifth of the time. It reads the ZIP with Node's zlib and
 * scans the XML with indexOf (linear, no backtracking). Whenever the file holds anything it does not
 * handle exactly as xlsx does (another sheet format, namespace prefixes, CDATA, date cells, cells out
 * of order, a ZIP64 or encrypted archive...) it answers `undefined` and the worker falls back to xlsx.
 *
 * Runs inside the parse worker only (parse-worker.mjs): same heap and time limits, and every part is
 * inflated with an output limit, whatever sizes the archive declares.
 *
 * Out: { sheetName, ref, fullref, table } where `ref`/`fullref` are ranges { s: { r, c }, e: { r, c } }
 * (0-based, like xlsx's `!ref`/`!fullref`) and `table()` gives the rows of `ref`, as sheet_to_json's.
 */
import { inflateRawSync } from 'node:zlib';

const decoder = new TextDecoder('utf-8', { fatal: true });

/**
 * The xlsx reading this reader reproduces: the parse worker reads with these options when it falls
 * back to xlsx, and the tests compare the two readings with them.
 */
export function xlsxReadOptions(sheetRows) {
  return {
    type: 'buffer',
    dense: true,
    raw: true,
    cellFormula: false,
    cellHTML: false,
    cellText: false,
    cellStyles: false,
    cellDates: false,
    bookVBA: false,
    sheetStubs: false,
    sheets: 0,
    // Read at most this many rows: a longer sheet is refused without holding it all.
    sheetRows,
  };
}

/**
 * A ZIP's central directory, read without inflating anything: { entries: [{ name, flags, method,
 * compressedSize, size, offset }], complete }, or undefined when there is no end-of-directory record.
 * `complete` is false when the directory stops short of its declared count (a damaged or hostile
 * archive): the entries read so far are still given, for the worker's size checks.
 */
export function zipDirectory(bytes) {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const minimum = Math.max(0, bytes.length - 65557);
  for (let offset = bytes.length - 22; offset >= minimum; offset -= 1) {
    if (view.getUint32(offset, true) !== 0x06054b50) continue;
    const count = view.getUint16(offset + 10, true);
    let cursor = view.getUint32(offset + 16, true);
    const entries = [];
    for (let index = 0; index < count; index += 1) {
      if (cursor + 46 > bytes.length || view.getUint32(cursor, true) !== 0x02014b50) return { entries, complete: false };
      const nameLength = view.getUint16(cursor + 28, true);
      entries.push({
        name: new TextDecoder().decode(bytes.subarray(cursor + 46, cursor + 46 + nameLength)),
        flags: view.getUint16(cursor + 8, true),
        method: view.getUint16(cursor + 10, true),
        compressedSize: view.getUint32(cursor + 20, true),
        size: view.getUint32(cursor + 24, true),
        offset: view.getUint32(cursor + 42, true),
      });
      cursor += 46 + nameLength + view.getUint16(cursor + 30, true) + view.getUint16(cursor + 32, true);
    }
    return { entries, complete: true };
  }
  return undefined;
}

/** Central-directory entries of a complete ZIP by name, or undefined. */
function zipEntries(bytes) {
  const directory = zipDirectory(bytes);
  if (!directory || !directory.complete) return undefined;
  return new Map(directory.entries.map((entry) => [entry.name, entry]));
}

/**
 * A part inflates past the limit although its declared size passed the worker's check: the archive
 * misstates it, and the worker must refuse the file rather than hand it to xlsx, which inflates
 * without a limit.
 */
export class PartTooLargeError extends RangeError {
  constructor(part, maxBytes) {
    super(`${part} expands beyond ${maxBytes} bytes`);
    this.part = part;
  }
}

/** A part's text, inflated with an output limit; undefined when it is missing or unusual. */
function partText(bytes, entries, name, maxBytes) {
  const entry = entries.get(name);
  if (!entry) return undefined;
  if (entry.flags & 1 || entry.size === 0xffffffff || entry.compressedSize === 0xffffffff) return undefined; // encrypted or ZIP64
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (entry.offset + 30 > bytes.length || view.getUint32(entry.offset, true) !== 0x04034b50) return undefined;
  const start = entry.offset + 30 + view.getUint16(entry.offset + 26, true) + view.getUint16(entry.offset + 28, true);
  const data = bytes.subarray(start, start + entry.compressedSize);
  let raw;
  if (entry.method === 0) raw = data;
  else if (entry.method === 8) {
    try {
      raw = inflateRawSync(data, { maxOutputLength: maxBytes });
    } catch (error) {
      throw error && error.code === 'ERR_BUFFER_TOO_LARGE' ? new PartTooLargeError(name, maxBytes) : error;
    }
  } else return undefined;
  if (raw.length > maxBytes) throw new PartTooLargeError(name, maxBytes);
  return decoder.decode(raw);
}

// XML text as xlsx decodes it: the five entities and character references, then _xHHHH_ escapes.
const ENTITIES = { '&quot;': '"', '&apos;': "'", '&gt;': '>', '&lt;': '<', '&amp;': '&' };
const entityPattern = /&(?:quot|apos|gt|lt|amp|#x?([\da-fA-F]+));/gi;
const escapePattern = /_x([\da-fA-F]{4})_/gi;
function unescape(text) {
  if (text.indexOf('&') < 0 && text.indexOf('_x') < 0 && text.indexOf('_X') < 0) return text;
  return text
    .replace(entityPattern, (all, code) => ENTITIES[all] || String.fromCharCode(parseInt(code, all.indexOf('x') > -1 ? 16 : 10)) || all)
    .replace(escapePattern, (all, code) => String.fromCharCode(parseInt(code, 16)));
}

/** The value of attribute `name` (unprefixed) in a start tag's text, or undefined. */
function attribute(tag, name) {
  const at = tag.indexOf(` ${name}="`);
  if (at < 0) return undefined;
  const start = at + name.length + 3;
  const end = tag.indexOf('"', start);
  return end < 0 ? undefined : tag.slice(start, end);
}

/**
 * Where the value of the one-letter attribute `letter` (its char code) starts in the tag text
 * xml[from, to), or -1. A loop over the tag's own characters: a search never runs past the tag.
 */
function attributeIn(xml, from, to, letter) {
  for (let index = from; index + 3 < to; index += 1) {
    if (xml.charCodeAt(index) === 32 && xml.charCodeAt(index + 1) === letter && xml.charCodeAt(index + 2) === 61 && xml.charCodeAt(index + 3) === 34) return index + 4;
  }
  return -1;
}

/** The text of a shared string or an inline string (the content of <si> or <is>), as xlsx's parse_si. */
function stringItem(content) {
  const text = content.trim();
  if (text === '') return null;
  if (text.startsWith('<t>') || text.startsWith('<t ') || text.startsWith('<t/')) {
    const open = text.indexOf('>');
    if (text[open - 1] === '/') return '';
    const close = text.indexOf('</t>', open);
    return unescape(close < 0 ? text.slice(open + 1) : text.slice(open + 1, close));
  }
  if (!text.includes('<r>')) return null;
  // Rich text: the runs' text, without phonetic runs.
  let parts = '';
  let cursor = 0;
  let phonetic = text.indexOf('<rPh');
  for (;;) {
    // Each search starts where the last one ended: linear in the string, whatever it holds.
    if (phonetic >= 0 && phonetic < cursor) phonetic = text.indexOf('<rPh', cursor);
    const open = text.indexOf('<t', cursor);
    if (open < 0) break;
    if (phonetic >= 0 && phonetic < open) {
      const end = text.indexOf('</rPh>', phonetic);
      if (end < 0) return undefined;
      cursor = end + 6;
      continue;
    }
    const next = text[open + 2];
    if (next !== '>' && next !== ' ' && next !== '/') {
      cursor = open + 2;
      continue;
    }
    const tagEnd = text.indexOf('>', open);
    if (tagEnd < 0) return undefined;
    if (text[tagEnd - 1] === '/') {
      cursor = tagEnd + 1;
      continue;
    }
    const close = text.indexOf('</t>', tagEnd);
    if (close < 0) return undefined;
    parts += text.slice(tagEnd + 1, close);
    cursor = close + 4;
  }
  return unescape(parts);
}

function sharedStrings(xml) {
  const strings = [];
  let cursor = 0;
  for (;;) {
    const open = xml.indexOf('<si', cursor);
    if (open < 0) break;
    const tagEnd = xml.indexOf('>', open);
    if (tagEnd < 0) return undefined;
    if (xml[open + 3] !== '>') return undefined;
    const close = xml.indexOf('</si>', tagEnd);
    if (close < 0) return undefined;
    const value = stringItem(xml.slice(tagEnd + 1, close));
    if (value === undefined) return undefined;
    strings.push(value);
    cursor = close + 5;
  }
  return strings;
}

/** "B12" → { r: 11, c: 1 }; undefined unless it is plain letters then digits. */
function decodeCell(text) {
  let column = 0;
  let index = 0;
  for (; index < text.length; index += 1) {
    const code = text.charCodeAt(index);
    if (code < 65 || code > 90) break;
    column = column * 26 + (code - 64);
  }
  if (index === 0 || index === text.length || index > 3) return undefined;
  const row = Number(text.slice(index));
  if (!Number.isInteger(row) || row < 1 || !/^\d+$/.test(text.slice(index))) return undefined;
  return { r: row - 1, c: column - 1 };
}

/** The first sheet's path and name from the workbook and its relationships. */
function firstSheet(workbookXml, relsXml) {
  const sheetAt = workbookXml.search(/<sheet\s/);
  if (sheetAt < 0) return undefined;
  const tag = workbookXml.slice(sheetAt, workbookXml.indexOf('>', sheetAt));
  const name = attribute(tag, 'name');
  const id = attribute(tag, 'r:id');
  if (name === undefined || id === undefined) return undefined;
  let target;
  let sharedTarget;
  // Each <Relationship …> tag by indexOf: a pattern like /<Relationship\s[^>]*>/g runs to the end of the
  // part from every unclosed tag, quadratic (a few kB of ZIP held the worker until its timeout).
  for (let cursor = 0; ; ) {
    const at = relsXml.indexOf('<Relationship', cursor);
    if (at < 0) break;
    if (!/\s/.test(relsXml[at + 13] ?? '')) {
      cursor = at + 13; // <Relationships> or another name
      continue;
    }
    const tagEnd = relsXml.indexOf('>', at);
    if (tagEnd < 0) break;
    const relation = relsXml.slice(at, tagEnd + 1);
    if (attribute(relation, 'Id') === id) target = attribute(relation, 'Target');
    if ((attribute(relation, 'Type') ?? '').endsWith('/sharedStrings')) sharedTarget = attribute(relation, 'Target');
    cursor = tagEnd + 1;
  }
  const resolve = (path) => (path === undefined || path.includes('..') ? undefined : path.startsWith('/') ? path.slice(1) : `xl/${path}`);
  const sheetPath = resolve(target);
  if (sheetPath === undefined) return undefined;
  return { name: unescape(name), sheetPath, sharedPath: resolve(sharedTarget) };
}

/**
 * The first sheet of an .xlsx as xlsx would read it, or undefined to let xlsx read it.
 * `sheetRows` as xlsx's option (rows beyond it are not read); `maxPartBytes` bounds each inflated part.
 */
export function readPlainXlsx(bytes, { sheetRows, maxPartBytes }) {
  const entries = zipEntries(bytes);
  if (!entries) return undefined;
  const workbookXml = partText(bytes, entries, 'xl/workbook.xml', maxPartBytes);
  const relsXml = partText(bytes, entries, 'xl/_rels/workbook.xml.rels', maxPartBytes);
  if (workbookXml === undefined || relsXml === undefined) return undefined;
  const sheet = firstSheet(workbookXml, relsXml);
  if (!sheet) return undefined;
  let strings = [];
  if (sheet.sharedPath !== undefined && entries.has(sheet.sharedPath)) {
    const xml = partText(bytes, entries, sheet.sharedPath, maxPartBytes);
    if (xml === undefined || xml.includes('<![CDATA[') || /<\w+:si\b/.test(xml)) return undefined;
    strings = sharedStrings(xml);
    if (!strings) return undefined;
  }
  const xml = partText(bytes, entries, sheet.sheetPath, maxPartBytes);
  if (xml === undefined || xml.includes('<![CDATA[')) return undefined;
  const dataStart = xml.indexOf('<sheetData');
  if (dataStart < 0 || /<\w+:(sheetData|row|c)\b/.test(xml.slice(0, 4096))) return undefined;
  const dataEnd = xml.lastIndexOf('</sheetData>');

  // The declared range, as xlsx's parse_ws_xml_dim (only a quoted "A1:B2" within 50 characters).
  let ref;
  const dimensionAt = xml.search(/<dimension/);
  if (dimensionAt > 0 && dimensionAt < dataStart) {
    const declared = /"(\w*:\w*)"/.exec(xml.slice(dimensionAt, dimensionAt + 50));
    if (declared) {
      const [from, to] = (declared[1] ?? '').split(':');
      const s = decodeCell(from ?? '');
      const e = decodeCell(to ?? '');
      if (!s || !e) return undefined;
      if (s.r <= e.r && s.c <= e.c) ref = { s, e };
    }
  }

  const rows = []; // dense: rows[r][c] = value (undefined for no cell)
  const guess = { s: { r: 2000000, c: 2000000 }, e: { r: 0, c: 0 } };
  let rowNumber = 0;
  let nextCell = -1;
  let cursor = xml.indexOf('>', dataStart) + 1;
  if (xml[cursor - 2] === '/' || dataEnd < 0) cursor = dataEnd < 0 ? xml.length : cursor;
  const end = dataEnd < 0 ? cursor : dataEnd;
  while (cursor < end) {
    const rowAt = xml.indexOf('<row', cursor);
    if (rowAt < 0 || rowAt >= end) break;
    const rowTagEnd = xml.indexOf('>', rowAt);
    if (rowTagEnd < 0) return undefined;
    const rowTag = xml.slice(rowAt, rowTagEnd);
    const declaredRow = attribute(rowTag, 'r');
    const nextRow = declaredRow === undefined ? rowNumber + 1 : Number(declaredRow);
    if (!Number.isInteger(nextRow) || nextRow <= rowNumber) return undefined; // out of order: let xlsx decide
    rowNumber = nextRow;
    if (rowNumber > sheetRows) break; // xlsx skips these rows, and they come in order
    if (guess.s.r > rowNumber - 1) guess.s.r = rowNumber - 1;
    if (guess.e.r < rowNumber - 1) guess.e.r = rowNumber - 1;
    if (xml[rowTagEnd - 1] === '/') {
      cursor = rowTagEnd + 1;
      continue;
    }
    const rowEnd = xml.indexOf('</row>', rowTagEnd);
    if (rowEnd < 0 || rowEnd > end) return undefined;
    let column = -1;
    let cellCursor = rowTagEnd + 1;
    while (cellCursor < rowEnd) {
      // The next cell anywhere ahead is remembered, so rows without cells do not search again.
      if (nextCell < cellCursor) nextCell = xml.indexOf('<c', cellCursor);
      if (nextCell < 0) nextCell = xml.length;
      const cellAt = nextCell;
      if (cellAt >= rowEnd) break;
      const after = xml[cellAt + 2];
      if (after !== ' ' && after !== '>' && after !== '/') return undefined;
      const cellTagEnd = xml.indexOf('>', cellAt);
      if (cellTagEnd < 0 || cellTagEnd > rowEnd) return undefined;
      const referenceAt = attributeIn(xml, cellAt, cellTagEnd, 114 /* r */);
      if (referenceAt >= 0) {
        // "B12": letters give the column; the digits must be this row's number.
        let position = referenceAt;
        let letters = 0;
        let code = xml.charCodeAt(position);
        for (column = 0; code >= 65 && code <= 90; code = xml.charCodeAt(++position)) {
          column = column * 26 + (code - 64);
          letters += 1;
        }
        column -= 1;
        let number = 0;
        const digitsAt = position;
        for (; code >= 48 && code <= 57; code = xml.charCodeAt(++position)) number = number * 10 + (code - 48);
        if (letters === 0 || letters > 3 || position === digitsAt || code !== 34 || number !== rowNumber) return undefined;
      } else column += 1;
      const typeAt = attributeIn(xml, cellAt, cellTagEnd, 116 /* t */);
      const type = typeAt < 0 ? undefined : xml.slice(typeAt, xml.indexOf('"', typeAt));
      let v;
      let content = '';
      if (xml.charCodeAt(cellTagEnd - 1) === 47) cellCursor = cellTagEnd + 1;
      else if (xml.startsWith('<v>', cellTagEnd + 1)) {
        // The usual cell, <c …><v>text</v></c>: no substring but the value's.
        const vEnd = xml.indexOf('</v>', cellTagEnd + 4);
        if (vEnd < 0 || vEnd > rowEnd || !xml.startsWith('</c>', vEnd + 4)) return undefined;
        if (vEnd > cellTagEnd + 4) v = unescape(xml.slice(cellTagEnd + 4, vEnd));
        cellCursor = vEnd + 8;
      } else {
        const contentEnd = xml.indexOf('</c>', cellTagEnd);
        if (contentEnd < 0 || contentEnd > rowEnd) return undefined;
        content = xml.slice(cellTagEnd + 1, contentEnd);
        if (content.includes('<c')) return undefined; // not the shape xlsx writes: let xlsx decide
        cellCursor = contentEnd + 4;
        const vAt = content.indexOf('<v');
        if (vAt >= 0) {
          const vTagEnd = content.indexOf('>', vAt);
          const vEnd = content.indexOf('</v>', vTagEnd);
          if (vTagEnd < 0 || content.charCodeAt(vTagEnd - 1) === 47 || vEnd < 0) return undefined;
          if (vEnd > vTagEnd + 1) v = unescape(content.slice(vTagEnd + 1, vEnd));
        }
      }
      if (type === undefined && v === undefined) continue;
      if (guess.s.c > column) guess.s.c = column;
      if (guess.e.c < column) guess.e.c = column;
      let value;
      switch (type ?? 'n') {
        case 'n':
          if (v === undefined) continue;
          value = parseFloat(v);
          break;
        case 's': {
          if (v === undefined) continue;
          const index = parseInt(v, 10);
          if (!(index >= 0 && index < strings.length)) return undefined;
          value = strings[index];
          break;
        }
        case 'str':
          value = v ?? '';
          break;
        case 'inlineStr': {
          const isAt = content.indexOf('<is>');
          const isEnd = content.indexOf('</is>', isAt);
          const text = isAt < 0 || isEnd < 0 ? '' : stringItem(content.slice(isAt + 4, isEnd));
          if (text === undefined) return undefined;
          value = text ?? '';
          break;
        }
        case 'b':
          value = v === '1' || v === 'true' || v === 'TRUE';
          break;
        case 'e':
          value = null;
          break;
        default:
          return undefined; // dates (t="d") and anything else: xlsx's own reading
      }
      let cells = rows[rowNumber - 1];
      if (!cells) cells = rows[rowNumber - 1] = [];
      cells[column] = value;
    }
    cursor = rowEnd + 6;
  }

  if (!ref && guess.e.c >= guess.s.c && guess.e.r >= guess.s.r) ref = { s: { ...guess.s }, e: { ...guess.e } };
  if (!ref) return { sheetName: sheet.name, ref: undefined, fullref: undefined, table: () => [] };
  let fullref = ref;
  if (sheetRows > 0 && sheetRows <= ref.e.r) {
    const clipped = { s: { ...ref.s }, e: { ...ref.e } };
    clipped.e.r = sheetRows - 1;
    if (clipped.e.r > guess.e.r) clipped.e.r = guess.e.r;
    if (clipped.e.r < clipped.s.r) clipped.s.r = clipped.e.r;
    if (clipped.e.c > guess.e.c) clipped.e.c = guess.e.c;
    if (clipped.e.c < clipped.s.c) clipped.s.c = clipped.e.c;
    ref = clipped;
  }
  // sheet_to_json(header: 1, raw, defval: null, blankrows): every row of the range, a missing row as [].
  // Built on demand, after the worker has checked the range: a declared <dimension ref="A1:XFD50000">
  // over a narrow list would otherwise fill rows × 16,384 cells before being refused.
  const range = ref;
  const table = () => {
    const table = [];
    for (let r = range.s.r; r <= range.e.r; r += 1) {
      const cells = rows[r];
      const row = [];
      if (cells) for (let c = range.s.c; c <= range.e.c; c += 1) row.push(cells[c] === undefined ? null : cells[c]);
      table.push(row);
    }
    return table;
  };
  return { sheetName: sheet.name, ref, fullref, table };
}
