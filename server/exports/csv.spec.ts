import Papa from 'papaparse';
import { neutraliseTextCell, writeCsv } from './csv';

describe('writeCsv', () => {
  // OWASP "CSV Injection": cells starting with = + - @ are run as formulas by spreadsheets.
  it('prefixes an apostrophe to text cells that could start a formula', () => {
    for (const text of ['=HYPERLINK("http://x","y")', '+1+1', '-2+3', '@SUM(A1)']) {
      expect(neutraliseTextCell(text)).toBe(`'${text}`);
    }
    expect(neutraliseTextCell('JR-07-0042')).toBe('JR-07-0042');
  });

  it('leaves negative numbers as numbers', () => {
    const csv = writeCsv(['value'], [[-0.005], ['-0.005']]);
    expect(csv).toBe("value\r\n-0.005\r\n'-0.005\r\n");
  });

  it('quotes commas, quotes and line breaks per RFC 4180 so the text reads back unchanged', () => {
    const text = 'toe, "north" side\nsecond line';
    const csv = writeCsv(['note', 'n'], [[text, 3], [null, true]]);
    const parsed = Papa.parse<string[]>(csv.trimEnd(), { header: false });
    expect(parsed.data).toEqual([['note', 'n'], [text, '3'], ['', 'yes']]);
    expect(csv).toContain('"toe, ""north"" side\nsecond line"');
  });
});
