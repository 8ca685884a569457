/**
 * The import template: a "Motors" sheet whose header row names every field with its unit (the unit
 * in brackets is read back as the column's unit), and a "Fields" sheet explaining each column.
 */
import * as XLSX from 'xlsx';
import { IMPORT_FIELD_INFO } from '../shared/intake.js';

export function importTemplate(): Buffer {
  const motors = XLSX.utils.aoa_to_sheet([IMPORT_FIELD_INFO.map((info) => info.label)]);
  motors['!cols'] = IMPORT_FIELD_INFO.map((info) => ({ wch: Math.max(12, info.label.length + 2) }));
  const fields = XLSX.utils.aoa_to_sheet([
    ['Column', 'Field', 'Unit', 'Other units accepted', 'Required', 'What to write', 'Example'],
    ...IMPORT_FIELD_INFO.map((info) => [
      info.label,
      info.field,
      info.unit,
      info.otherUnits.join(', '),
      info.required ? 'yes' : 'no',
      info.help,
      typeof info.example === 'number' ? info.example : info.example,
    ]),
  ]);
  fields['!cols'] = [{ wch: 26 }, { wch: 24 }, { wch: 8 }, { wch: 20 }, { wch: 9 }, { wch: 70 }, { wch: 20 }];
  const workbook = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(workbook, motors, 'Motors');
  XLSX.utils.book_append_sheet(workbook, fields, 'Fields');
  return XLSX.write(workbook, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}
