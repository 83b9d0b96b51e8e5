/**
 * Reading a lab's results file (the Heapsight results CSV, documented in README.md) into a
 * row-by-row report, before anything is saved. Nothing here touches the database: it gets the
 * batch's items and answers, for the file and for every row, what it found.
 *
 * Conventions accepted for a value below detection: `<0.005` (limit given), `-0.005` (a negative
 * number standing for "below this limit", a common laboratory convention, no source), `BDL`,
 * `ND` or `<DL` (at the row's detection limit, else the batch's), and a plain number below the
 * detection limit. `>100` is above the method's upper range: kept, flagged for a re-assay.
 * Values are censored, never silent zeros (Miesch 1967), through the engine's `parseAssayValue`.
 */
import Papa from 'papaparse';
import { parseAssayValue, type AssayValue } from '../../shared/engine';

/** Largest results file accepted (bytes): a batch of a thousand rows is about 60 kB. */
export const MAX_RESULTS_BYTES = 2 * 1024 * 1024;

/** What was found on one row. The first three may be saved; every other one blocks the import. */
export type RowStatus =
  | 'matched'
  | 'below-detection'
  | 'above-range'
  | 'unknown-code'
  | 'missing-code'
  | 'duplicate-row'
  | 'not-a-number'
  | 'missing-value'
  | 'wrong-units'
  | 'wrong-batch'
  | 'formula-cell'
  | 'wrong-cell-count';

/** Row statuses that can be saved. */
export const SAVABLE_STATUSES: readonly RowStatus[] = ['matched', 'below-detection', 'above-range'];

/** Problems with the file as a whole; any of them blocks the import. */
export type FileProblemCode = 'empty-file' | 'not-text' | 'wrong-delimiter' | 'missing-column' | 'unknown-column' | 'repeated-column' | 'no-rows' | 'not-csv';

/** One problem with the whole file. */
export interface FileProblem {
  readonly code: FileProblemCode;
  readonly message: string;
}

/** One data row of the file as understood. */
export interface ResultRow {
  /** Line number in the file (the header is line 1). */
  readonly line: number;
  readonly sampleCode: string;
  readonly rawValue: string;
  readonly status: RowStatus;
  readonly message: string;
  readonly isBlocking: boolean;
  /** The batch item the code names, when it names one. */
  readonly itemId: string | null;
  readonly value: AssayValue | null;
  readonly method: string | null;
  readonly labJob: string | null;
}

/** The parsed file: its problems and its rows. */
export interface ParsedResults {
  readonly fileProblems: readonly FileProblem[];
  readonly rows: readonly ResultRow[];
  /** Lab codes of the batch that no row reports. */
  readonly notInFile: readonly string[];
}

/** What the parser needs to know of the batch. */
export interface BatchForResults {
  readonly code: string;
  readonly detectionLimitGpt: number;
  readonly upperLimitGpt: number | null;
  readonly method: string;
  readonly items: readonly { readonly id: string; readonly labCode: string }[];
}

/** The columns of the results CSV, by the name in the header (case and spaces around ignored). */
const COLUMNS = {
  sampleCode: 'sample code',
  value: 'au g/t',
  detectionLimit: 'detection limit g/t',
  units: 'units',
  method: 'method',
  labJob: 'lab job',
  batchId: 'batch id',
} as const;
const REQUIRED: readonly (keyof typeof COLUMNS)[] = ['sampleCode', 'value'];
/** Units equal to g/t (NIST SP 811: 1 g/t = 1 ppm = 1 mg/kg). */
const GRAM_PER_TONNE_UNITS = ['g/t', 'gpt', 'ppm', 'mg/kg'];
const BELOW_DETECTION_WORDS = ['bdl', 'nd', '<dl', 'n.d.', '<lod'];
/** Cells a spreadsheet would run as a formula (OWASP "CSV Injection"); a negative number is not one. */
const FORMULA_START = /^[=+@]|^-(?![0-9.])/;
const PLAIN_NUMBER = /^-?[0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?$/;

/** Parses and checks a results file against a batch; pure, for the dry run and the save alike. */
export function parseResultsFile(bytes: Buffer, batch: BatchForResults): ParsedResults {
  const refused = (code: FileProblemCode, message: string): ParsedResults => ({ fileProblems: [{ code, message }], rows: [], notInFile: batch.items.map((item) => item.labCode) });
  if (bytes.length === 0 || bytes.toString('utf8').trim() === '' || bytes.toString('utf8').trim() === '\ufeff') {
    return refused('empty-file', 'The file is empty: export the results sheet again, with its header row.');
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return refused('not-text', 'The file is not UTF-8 text (is it a spreadsheet workbook or a PDF?): save the results as CSV, UTF-8.');
  }
  if (text.includes('\u0000')) {
    return refused('not-text', 'The file holds binary data, not CSV text: save the results as CSV, UTF-8.');
  }
  // A UTF-8 byte-order mark is allowed (spreadsheets write one) and dropped.
  text = text.replace(/^\ufeff/, '');
  const parsed = Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: 'greedy', header: false });
  const [header, ...body] = parsed.data;
  if (!header || header.length === 0) {
    return refused('empty-file', 'The file has no header row.');
  }
  const names = header.map((name) => name.trim().toLowerCase());
  const problems: FileProblem[] = [];
  if (names.length === 1 && /[;\t|]/.test(header[0] ?? '')) {
    const used = (header[0] ?? '').includes(';') ? 'semicolons' : (header[0] ?? '').includes('\t') ? 'tabs' : 'bars';
    return refused('wrong-delimiter', `The columns are separated by ${used}; this format uses commas (and a point as the decimal mark). Export again as "CSV, comma-separated".`);
  }
  const indexOf: Partial<Record<keyof typeof COLUMNS, number>> = {};
  names.forEach((name, index) => {
    const key = (Object.keys(COLUMNS) as (keyof typeof COLUMNS)[]).find((candidate) => COLUMNS[candidate] === name);
    if (!key) {
      problems.push({ code: 'unknown-column', message: `Column ${index + 1}, "${header[index]}", is not part of this format (expected: ${Object.values(COLUMNS).join(', ')}).` });
    } else if (indexOf[key] !== undefined) {
      problems.push({ code: 'repeated-column', message: `The column "${COLUMNS[key]}" appears twice.` });
    } else {
      indexOf[key] = index;
    }
  });
  for (const key of REQUIRED) {
    if (indexOf[key] === undefined) {
      const hint = key === 'value' && names.some((name) => name.startsWith('au')) ? ' (values must be in g/t, in a column named "Au g/t")' : '';
      problems.push({ code: 'missing-column', message: `The required column "${COLUMNS[key]}" is missing${hint}.` });
    }
  }
  if (problems.length > 0) {
    return { fileProblems: problems, rows: [], notInFile: batch.items.map((item) => item.labCode) };
  }
  if (body.length === 0) {
    return refused('no-rows', 'The file has a header but no results.');
  }

  const itemsByCode = new Map(batch.items.map((item) => [item.labCode.toUpperCase(), item]));
  const firstLineOfCode = new Map<string, number>();
  const lineNumbers = lineNumbersOf(text, parsed.data.length);
  const rows: ResultRow[] = body.map((cells, bodyIndex) => {
    const line = lineNumbers[bodyIndex + 1] ?? bodyIndex + 2;
    const cell = (key: keyof typeof COLUMNS) => (indexOf[key] === undefined ? '' : (cells[indexOf[key] as number] ?? '').trim());
    const sampleCode = cell('sampleCode');
    const rawValue = cell('value');
    const base = { line, sampleCode, rawValue, itemId: null, value: null, method: cell('method') || null, labJob: cell('labJob') || null };
    const blocked = (status: RowStatus, message: string): ResultRow => ({ ...base, status, message, isBlocking: true });
    if (cells.length !== header.length) {
      return blocked('wrong-cell-count', `This row has ${cells.length} cells but the header has ${header.length}${cells.length > header.length ? ' (a comma inside a number? use a point as the decimal mark)' : ''}.`);
    }
    const formulaCell = cells.find((text) => FORMULA_START.test(text.trim()));
    if (formulaCell !== undefined) {
      return blocked('formula-cell', `A cell holds a spreadsheet formula (${truncate(formulaCell.trim())}); results must be plain values.`);
    }
    if (sampleCode === '') {
      return blocked('missing-code', 'The sample code is empty.');
    }
    const item = itemsByCode.get(sampleCode.toUpperCase());
    if (!item) {
      return blocked('unknown-code', `"${truncate(sampleCode)}" is not a sample code of batch ${batch.code}.`);
    }
    const withItem = { ...base, itemId: item.id };
    const blockedItem = (status: RowStatus, message: string): ResultRow => ({ ...withItem, status, message, isBlocking: true });
    const firstLine = firstLineOfCode.get(item.labCode);
    if (firstLine !== undefined) {
      return blockedItem('duplicate-row', `${item.labCode} is reported again (first on line ${firstLine}); keep one row per sample.`);
    }
    firstLineOfCode.set(item.labCode, line);
    const batchId = cell('batchId');
    if (batchId !== '' && batchId.toUpperCase() !== batch.code.toUpperCase()) {
      return blockedItem('wrong-batch', `The row names batch ${truncate(batchId)}, but this is batch ${batch.code}.`);
    }
    const units = cell('units').toLowerCase();
    if (units !== '' && !GRAM_PER_TONNE_UNITS.includes(units)) {
      return blockedItem('wrong-units', `The units are "${truncate(cell('units'))}"; report gold in g/t (or ppm).`);
    }
    const limitText = cell('detectionLimit');
    let detectionLimitGpt = batch.detectionLimitGpt;
    if (limitText !== '') {
      const limit = Number(limitText);
      if (!PLAIN_NUMBER.test(limitText) || !(limit > 0)) {
        return blockedItem('not-a-number', `The detection limit "${truncate(limitText)}" is not a positive number${limitText.includes(',') ? ' (use a point as the decimal mark)' : ''}.`);
      }
      detectionLimitGpt = limit;
    }
    if (rawValue === '') {
      return blockedItem('missing-value', `No value for ${item.labCode}; write BDL or <limit when below detection.`);
    }
    const value = readValue(rawValue, detectionLimitGpt);
    if (!value.ok) {
      return blockedItem('not-a-number', value.message);
    }
    const accepted = { ...withItem, value: value.value, isBlocking: false };
    if (value.value.isBelowDetection) {
      return { ...accepted, status: 'below-detection', message: `Below detection (< ${value.value.detectionLimitGpt} g/t): kept as a censored value.` };
    }
    const upper = batch.upperLimitGpt;
    if (value.value.isAboveRange || (upper !== null && value.value.valueGpt > upper)) {
      return { ...accepted, value: { ...value.value, isAboveRange: true }, status: 'above-range', message: `Above the method's range (> ${value.value.valueGpt} g/t): kept as a floor; ask for a re-assay with a gravimetric finish.` };
    }
    return { ...accepted, status: 'matched', message: 'Matched.' };
  });
  const reported = new Set(rows.filter((row) => row.itemId !== null).map((row) => row.itemId));
  return { fileProblems: [], rows, notInFile: batch.items.filter((item) => !reported.has(item.id)).map((item) => item.labCode) };
}

function readValue(raw: string, detectionLimitGpt: number): { ok: true; value: AssayValue } | { ok: false; message: string } {
  const compact = raw.replace(/\s+/g, '');
  if (BELOW_DETECTION_WORDS.includes(compact.toLowerCase())) {
    return { ok: true, value: { valueGpt: detectionLimitGpt, isBelowDetection: true, isAboveRange: false, detectionLimitGpt, raw } };
  }
  if (compact.startsWith('-') && PLAIN_NUMBER.test(compact)) {
    const limit = Math.abs(Number(compact));
    if (limit === 0) {
      return { ok: false, message: `"${raw}" is not a value or a detection limit.` };
    }
    return { ok: true, value: { valueGpt: limit, isBelowDetection: true, isAboveRange: false, detectionLimitGpt: limit, raw } };
  }
  const parsed = parseAssayValue(compact, detectionLimitGpt);
  if (!parsed.ok) {
    const hint = /^[<>]?[0-9]+,[0-9]+$/.test(compact) ? ' (use a point as the decimal mark: 0.53, not 0,53)' : '';
    return { ok: false, message: `"${truncate(raw)}" is not a number, <limit, >limit or BDL${hint}.` };
  }
  const value = parsed.value;
  return { ok: true, value: value.isBelowDetection && !compact.startsWith('<') ? { ...value, detectionLimitGpt } : { ...value, raw } };
}

/** The file line each parsed record starts on (records may span lines inside quotes). */
function lineNumbersOf(text: string, recordCount: number): number[] {
  const lines: number[] = [];
  let line = 1;
  let isQuoted = false;
  let isRecordStart = true;
  for (let index = 0; index < text.length && lines.length < recordCount; index += 1) {
    const char = text[index];
    if (isRecordStart && char !== '\n' && char !== '\r') {
      lines.push(line);
      isRecordStart = false;
    }
    if (char === '"') {
      isQuoted = !isQuoted;
    } else if (char === '\n') {
      line += 1;
      if (!isQuoted) isRecordStart = true;
    }
  }
  return lines;
}

function truncate(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}
