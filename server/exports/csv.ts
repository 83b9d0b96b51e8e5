/**
 * CSV files the server writes: UTF-8, a header row, comma-separated, quoted per RFC 4180 by
 * papaparse, CRLF line ends (RFC 4180 §2).
 *
 * Spreadsheet formula injection (OWASP, "CSV Injection"): a spreadsheet runs a cell that begins
 * with `=`, `+`, `-` or `@` (and, in some programs, a tab or carriage return) as a formula. Every
 * *text* cell that begins so gets a leading apostrophe, which spreadsheets show as plain text.
 * Number cells are written as numbers and never touched, so a negative number stays a number.
 */
import Papa from 'papaparse';

/** One cell: a number (written as is), text (neutralised when it could start a formula), or empty. */
export type CsvCell = string | number | boolean | null;

const FORMULA_START = /^[=+\-@\t\r]/;

/** Makes a text cell safe to open in a spreadsheet (OWASP CSV Injection). */
export function neutraliseTextCell(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** Writes a header and rows as CSV text, neutralising text cells only. */
export function writeCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  const data = rows.map((row) =>
    row.map((cell) => {
      if (cell === null) return '';
      if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
      if (typeof cell === 'boolean') return cell ? 'yes' : 'no';
      return neutraliseTextCell(cell);
    }),
  );
  return `${Papa.unparse({ fields: header.map(neutraliseTextCell), data }, { newline: '\r\n', quotes: false, header: true })}\r\n`;
}
