import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import { pdfText } from '../shortlist/shortlist-report';
import type { ReservedLabels } from './labels.service';

/** Labels across and down an A4 page: the common 3 × 8 sheet of 70 × 37 mm stickers. */
export const LABEL_COLUMNS = 3;
export const LABEL_ROWS = 8;
export const LABELS_PER_PAGE = LABEL_COLUMNS * LABEL_ROWS;

const POINTS_PER_MM = 72 / 25.4;
/** 4.5 mm top and bottom leaves 8 rows of 36 mm; most office printers cannot print nearer the edge. */
const PAGE_MARGIN_Y = 4.5 * POINTS_PER_MM;
const PAGE_MARGIN_X = 0;
/** Inner padding so a label cut slightly off-line still shows its whole QR code and text. */
const CELL_PADDING = 3 * POINTS_PER_MM;
/** Quiet zone around the QR code in modules; readers need about two at label sizes. */
const QR_QUIET_MODULES = 2;
const INK = '#000000';

/** Draws a QR code as filled squares (vector, so it stays sharp at any printer resolution). */
function drawQr(document: PDFKit.PDFDocument, text: string, x: number, y: number, size: number): void {
  // Level M survives a smudge or a torn corner on a muddy bag; the code is short, so the symbol stays small.
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const modules = qr.modules.size;
  const moduleSize = size / (modules + 2 * QR_QUIET_MODULES);
  document.save().fillColor(INK);
  for (let row = 0; row < modules; row += 1) {
    for (let column = 0; column < modules; column += 1) {
      if (qr.modules.get(row, column)) {
        const left = x + (column + QR_QUIET_MODULES) * moduleSize;
        const top = y + (row + QR_QUIET_MODULES) * moduleSize;
        // A hair of overlap so adjacent squares print without white seams.
        document.rect(left, top, moduleSize + 0.05, moduleSize + 0.05);
      }
    }
  }
  document.fill();
  document.restore();
}

/** The largest font size (up to `largest`) at which `text` fits `width`. */
function fittingSize(document: PDFKit.PDFDocument, text: string, width: number, largest: number): number {
  document.fontSize(largest);
  const measured = document.widthOfString(text);
  return measured <= width ? largest : Math.floor((largest * width) / measured * 10) / 10;
}

function drawLabel(document: PDFKit.PDFDocument, code: string, siteName: string, x: number, y: number, width: number, height: number): void {
  const innerHeight = height - 2 * CELL_PADDING;
  const qrSize = innerHeight;
  drawQr(document, code, x + CELL_PADDING, y + CELL_PADDING, qrSize);
  const textLeft = x + CELL_PADDING + qrSize + 2;
  const textWidth = width - (textLeft - x) - CELL_PADDING;
  const sequence = code.slice(code.lastIndexOf('-') + 1);
  // The whole code, as large as fits, then the running number alone in big figures: it is what a
  // crew reads aloud and writes in the notebook.
  document.font('Helvetica-Bold').fillColor(INK);
  const codeSize = fittingSize(document, code, textWidth, 16);
  document.fontSize(codeSize).text(code, textLeft, y + CELL_PADDING + 2, { width: textWidth, lineBreak: false });
  const sequenceSize = fittingSize(document, sequence, textWidth, 30);
  document.fontSize(sequenceSize).text(sequence, textLeft, y + CELL_PADDING + codeSize + 6, { width: textWidth, lineBreak: false });
  document.font('Helvetica').fontSize(7);
  document.text(pdfText(siteName), textLeft, y + height - CELL_PADDING - 9, { width: textWidth, lineBreak: false, ellipsis: true });
}

/** The reserved codes as a printable A4 PDF, 24 labels a page, each with a QR code and the code in large text. */
export function labelSheetPdf(labels: ReservedLabels): Promise<Buffer> {
  const document = new PDFDocument({
    size: 'A4', margin: 0, autoFirstPage: false,
    info: { Title: pdfText(`Sample labels ${labels.codes[0]} to ${labels.codes[labels.codes.length - 1]}`), Author: 'Heapsight', Subject: `Sample labels for ${pdfText(labels.site.name)}` },
  });
  const chunks: Buffer[] = [];
  document.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    document.on('end', () => resolve(Buffer.concat(chunks)));
    document.on('error', reject);
  });

  for (let index = 0; index < labels.codes.length; index += 1) {
    const onPage = index % LABELS_PER_PAGE;
    if (onPage === 0) {
      document.addPage({ size: 'A4', margin: 0 });
    }
    const cellWidth = (document.page.width - 2 * PAGE_MARGIN_X) / LABEL_COLUMNS;
    const cellHeight = (document.page.height - 2 * PAGE_MARGIN_Y) / LABEL_ROWS;
    const column = onPage % LABEL_COLUMNS;
    const row = Math.floor(onPage / LABEL_COLUMNS);
    drawLabel(document, labels.codes[index], `${labels.site.name} (${labels.site.code})`, PAGE_MARGIN_X + column * cellWidth, PAGE_MARGIN_Y + row * cellHeight, cellWidth, cellHeight);
  }
  document.end();
  return finished;
}
