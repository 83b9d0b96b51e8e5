import Papa from 'papaparse';
import { shortlistColumns } from './shortlist-table';
import type { ShortlistView } from './shortlist.service';

/** Characters that make a spreadsheet read a cell as a formula (OWASP, CSV injection). */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * Makes a text cell safe to open in a spreadsheet: one that starts like a formula gets a leading
 * apostrophe. Numbers stay numbers (a negative net value is data, not a formula).
 */
export function neutraliseCell(value: string | number | null): string | number {
  if (value === null) {
    return '';
  }
  if (typeof value === 'number') {
    return Number.isFinite(value) ? value : '';
  }
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/** The shortlist table as CSV (same columns as the PDF), full precision, with formula cells neutralised. */
export function shortlistCsv(view: ShortlistView): string {
  const columns = shortlistColumns(view);
  const rows = view.rows.map((row) => columns.map((column) => neutraliseCell(column.value(row))));
  return Papa.unparse({ fields: columns.map((column) => String(neutraliseCell(column.header))), data: rows }, { newline: '\r\n' });
}
