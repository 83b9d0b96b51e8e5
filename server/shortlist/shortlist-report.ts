import PDFDocument from 'pdfkit';
import { CAUTIONS, PLANNING_ESTIMATE_STATEMENT } from '../../shared/safety/cautions';
import { shortlistColumns } from './shortlist-table';
import type { ShortlistRow, ShortlistView } from './shortlist.service';

/**
 * The printable decision report of a shortlist (A4 landscape, PDFKit's built-in Helvetica so it
 * needs no font files): site, date, parameters, a map thumbnail of the piles and the processing
 * point, the table, the piles too thin to rank, the assumptions, the safety cautions and the
 * statement that the figures are planning estimates. Same columns as the CSV where they fit.
 */

/** Built-in PDF fonts speak WinAnsi only; these stand in for the few other characters we use. */
const REPLACEMENTS: Readonly<Record<string, string>> = { '≥': '>=', '≤': '<=', '−': '-', '→': '->', '\u2009': ' ', '\u202f': ' ', 'Σ': 'sum' };
const WIN_ANSI_EXTRA = new Set('‘’“”–—…•€™‰'.split(''));

/** Text safe for the built-in fonts: known stand-ins, and '?' for anything they cannot draw. */
export function pdfText(text: string): string {
  return [...text]
    .map((character) => {
      if (REPLACEMENTS[character] !== undefined) return REPLACEMENTS[character];
      const code = character.codePointAt(0) ?? 0;
      return (code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || character === '\n' || WIN_ANSI_EXTRA.has(character) ? character : '?';
    })
    .join('');
}

const PAGE_MARGIN = 36;
const INK = '#1b1b1b';
const MUTED = '#555555';
const RULE = '#9a9a9a';

function formatNumber(value: string | number | null, digits = 0): string {
  if (value === null) return '-';
  if (typeof value === 'string') return value;
  return value.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

function percent(fraction: number): string {
  return `${(fraction * 100).toFixed(1)} %`;
}

/** The report as PDF bytes. */
export function shortlistReportPdf(view: ShortlistView): Promise<Buffer> {
  const document = new PDFDocument({
    size: 'A4', layout: 'landscape', margin: PAGE_MARGIN, bufferPages: true,
    info: { Title: pdfText(`Shortlist - ${view.site.name}`), Author: 'Heapsight', Subject: 'Decision report: piles ranked for reprocessing (planning estimates)' },
  });
  const chunks: Buffer[] = [];
  document.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    document.on('end', () => resolve(Buffer.concat(chunks)));
    document.on('error', reject);
  });

  const width = document.page.width - 2 * PAGE_MARGIN;
  const text = (value: string, options: PDFKit.Mixins.TextOptions = {}) => document.text(pdfText(value), options);

  // Heading, site and date.
  document.fillColor(INK).font('Helvetica-Bold').fontSize(18);
  text(`Shortlist: ${view.site.name} (${view.site.code})`);
  document.font('Helvetica').fontSize(10).fillColor(MUTED);
  text(`Decision report made by Heapsight on ${view.generatedAt.slice(0, 10)} at ${view.generatedAt.slice(11, 16)} UTC. Money in ${view.parameters.currency}.`);
  document.moveDown(0.4);
  statementBox(document, width);
  document.moveDown(0.6);

  // Parameters on the left, the map thumbnail on the right.
  const top = document.y;
  const mapWidth = 250;
  const mapHeight = 170;
  parameterBlock(document, view, width - mapWidth - 16);
  const afterParameters = document.y;
  mapThumbnail(document, view, PAGE_MARGIN + width - mapWidth, top, mapWidth, mapHeight);
  document.y = Math.max(afterParameters, top + mapHeight + 18);
  document.x = PAGE_MARGIN;

  shortlistTable(document, view, width);
  thinDataList(document, view);
  assumptionList(document, view);
  cautionList(document, width);

  // Page numbers and the statement in every footer.
  const pages = document.bufferedPageRange();
  for (let index = pages.start; index < pages.start + pages.count; index += 1) {
    document.switchToPage(index);
    const bottom = document.page.height - PAGE_MARGIN + 8;
    document.page.margins.bottom = 0;
    document.font('Helvetica').fontSize(7).fillColor(MUTED);
    document.text(pdfText(`Planning estimates, not a resource statement.  ${view.site.code} shortlist, page ${index + 1} of ${pages.count}`), PAGE_MARGIN, bottom, { width, align: 'center', lineBreak: false });
  }
  document.end();
  return finished;
}

function statementBox(document: PDFKit.PDFDocument, width: number): void {
  const y = document.y;
  document.font('Helvetica-Bold').fontSize(10);
  const height = document.heightOfString(pdfText(PLANNING_ESTIMATE_STATEMENT), { width: width - 20 }) + 12;
  document.save().rect(PAGE_MARGIN, y, width, height).lineWidth(1.5).stroke(INK).restore();
  document.fillColor(INK).text(pdfText(PLANNING_ESTIMATE_STATEMENT), PAGE_MARGIN + 10, y + 6, { width: width - 20 });
  document.y = y + height;
  document.x = PAGE_MARGIN;
}

function parameterBlock(document: PDFKit.PDFDocument, view: ShortlistView, width: number): void {
  const p = view.parameters;
  const source = (name: keyof typeof view.sources) => (view.sources[name] === 'site' ? '' : ` (${view.sources[name]})`);
  const recoveryNote = view.recoverySource === 'trials' ? `from ${view.acceptedTrialCount} accepted trial(s)` : view.recoverySource === 'query' ? 'what-if value' : 'stated default, no accepted trial';
  const lines: [string, string][] = [
    ['Gold price', `${formatNumber(p.goldPricePerTroyOz, 2)} ${p.currency} per troy oz${source('goldPricePerTroyOz')}`],
    ['Recovery', `${percent(p.recovery)} (${recoveryNote})`],
    ['Payable', `${percent(p.payableFraction)}${source('payableFraction')}`],
    ['Load and haul', `${formatNumber(p.haulCostPerTKm, 2)} ${p.currency} per t·km, road factor ${p.roadFactor}${source('haulCostPerTKm')}`],
    ['Processing', `${formatNumber(p.processingCostPerT, 2)} ${p.currency} per t${source('processingCostPerT')}`],
    ['Fixed cost', `${formatNumber(p.fixedCostPerPile, 0)} ${p.currency} per pile${source('fixedCostPerPile')}`],
    ['Owner / crew share', `${percent(p.ownerShareOfGross)} of gross${source('ownerShareOfGross')}`],
    ['Confidence level', `${percent(p.confidenceLevel)} (conservative value at the lower bound)`],
    ['Ranked if', `at least ${p.minSamplesToRank} graded samples, tonnage and a footprint`],
    ['Processing point', view.site.processingPoint ? `${view.site.processingPoint.lat.toFixed(5)}, ${view.site.processingPoint.lon.toFixed(5)} (lat, lon)` : 'not set'],
  ];
  document.font('Helvetica-Bold').fontSize(11).fillColor(INK);
  document.text('Parameters', PAGE_MARGIN, document.y, { width });
  document.moveDown(0.2);
  for (const [label, value] of lines) {
    const y = document.y;
    document.font('Helvetica-Bold').fontSize(9).fillColor(INK).text(pdfText(label), PAGE_MARGIN, y, { width: 110 });
    document.font('Helvetica').text(pdfText(value), PAGE_MARGIN + 112, y, { width: width - 112 });
  }
}

/** A vector sketch of the footprints and the processing point, north up, with a scale bar. */
function mapThumbnail(document: PDFKit.PDFDocument, view: ShortlistView, x: number, y: number, width: number, height: number): void {
  document.save();
  document.rect(x, y, width, height).lineWidth(1).stroke(RULE);
  document.font('Helvetica-Bold').fontSize(8).fillColor(INK).text('Map (north up)', x + 6, y + 5, { lineBreak: false });
  const rings = view.rows.filter((row) => row.footprint).map((row) => ({ row, ring: row.footprint?.coordinates[0] ?? [] }));
  const points: [number, number][] = rings.flatMap(({ ring }) => ring.map((point) => [point[0], point[1]] as [number, number]));
  const processing = view.site.processingPoint;
  if (processing) points.push([processing.lon, processing.lat]);
  if (points.length === 0) {
    document.font('Helvetica').fontSize(8).fillColor(MUTED).text('No footprints recorded yet.', x + 6, y + height / 2, { width: width - 12, align: 'center' });
    document.restore();
    return;
  }
  const lat0 = points.reduce((sum, point) => sum + point[1], 0) / points.length;
  const scaleX = Math.cos((lat0 * Math.PI) / 180);
  const xs = points.map((point) => point[0] * scaleX);
  const ys = points.map((point) => point[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const pad = 22;
  const spanDeg = Math.max(maxX - minX, maxY - minY, 1e-5);
  const scale = Math.min((width - 2 * pad) / Math.max(maxX - minX, 1e-5 * spanDeg), (height - 2 * pad - 10) / Math.max(maxY - minY, 1e-5 * spanDeg));
  const cx = x + width / 2;
  const cy = y + 10 + height / 2;
  const project = (lon: number, lat: number): [number, number] => [cx + (lon * scaleX - (minX + maxX) / 2) * scale, cy - (lat - (minY + maxY) / 2) * scale];
  for (const { row, ring } of rings) {
    const projected = ring.map((point) => project(point[0], point[1]));
    const [first, ...rest] = projected;
    if (!first) continue;
    document.moveTo(first[0], first[1]);
    for (const point of rest) document.lineTo(point[0], point[1]);
    document.closePath().lineWidth(row.isRankable ? 1.2 : 0.6).dash(row.isRankable ? 1000 : 2, { space: row.isRankable ? 0 : 2 }).stroke(INK).undash();
    const centre = row.centroid ? project(row.centroid.lon, row.centroid.lat) : first;
    document.font('Helvetica').fontSize(6.5).fillColor(INK).text(pdfText(row.rank ? `#${row.rank} ${row.code}` : row.code), centre[0] + 3, centre[1] - 3, { lineBreak: false });
  }
  if (processing) {
    const [px, py] = project(processing.lon, processing.lat);
    document.rect(px - 3, py - 3, 6, 6).fill(INK);
    document.font('Helvetica-Bold').fontSize(6.5).text('Processing', px - 16, py + 5, { lineBreak: false });
  }
  // Scale bar: one degree of latitude is about 111.32 km (mean, common practice, no source).
  const metresPerPoint = 111_320 / scale;
  const niceMetres = [10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 10000, 20000].find((metres) => metres / metresPerPoint > 30) ?? 50000;
  const barLength = niceMetres / metresPerPoint;
  document.moveTo(x + 8, y + height - 8).lineTo(x + 8 + barLength, y + height - 8).lineWidth(1.5).stroke(INK);
  document.font('Helvetica').fontSize(6.5).fillColor(INK).text(niceMetres >= 1000 ? `${niceMetres / 1000} km` : `${niceMetres} m`, x + 10 + barLength, y + height - 11, { lineBreak: false });
  document.font('Helvetica').fontSize(6).fillColor(MUTED).text('solid: ranked, dashed: not ranked', x + width - 120, y + height - 10, { width: 114, align: 'right', lineBreak: false });
  document.restore();
}

/** The columns that fit on the page, in the CSV's order. */
const PDF_COLUMNS: readonly { header: string; width: number }[] = [
  { header: 'Rank', width: 28 }, { header: 'Pile', width: 72 }, { header: 'Dry t', width: 48 }, { header: 'Grade g/t (best)', width: 44 },
  { header: 'Grade g/t (conservative)', width: 58 }, { header: 'Recoverable Au g', width: 56 }, { header: 'Gross', width: 56 },
  { header: 'Costs', width: 56 }, { header: 'Owner share', width: 52 }, { header: 'Net', width: 58 }, { header: 'Net per t', width: 42 },
  { header: 'Break-even g/t', width: 46 }, { header: 'Conservative net', width: 58 }, { header: 'Ranks price -/+', width: 44 }, { header: 'Ranks recovery -/+', width: 52 },
];

function tableCells(view: ShortlistView, row: ShortlistRow): string[] {
  const columns = new Map(shortlistColumns(view).map((column) => [column.header.replace(` ${view.parameters.currency}`, ''), column]));
  const cell = (header: string) => {
    const column = columns.get(header);
    return column ? formatNumber(column.value(row), column.digits ?? 0) : '-';
  };
  const costs = row.haulCost === null || row.processingCost === null || row.fixedCost === null ? null : row.haulCost + row.processingCost + row.fixedCost;
  return [
    row.rank === null ? 'not ranked' : String(row.rank), row.code, cell('Dry t'), cell('Grade g/t (best)'), cell('Grade g/t (conservative)'),
    cell('Recoverable Au g'), cell('Gross'), formatNumber(costs, 0), cell('Owner share'), cell('Net'), cell('Net per t'), cell('Break-even g/t'),
    cell('Conservative net'), row.ranks ? `${row.ranks.priceDown} / ${row.ranks.priceUp}` : '-', row.ranks ? `${row.ranks.recoveryDown} / ${row.ranks.recoveryUp}` : '-',
  ];
}

function shortlistTable(document: PDFKit.PDFDocument, view: ShortlistView, width: number): void {
  document.font('Helvetica-Bold').fontSize(11).fillColor(INK).text(pdfText(`Piles ranked by net value (${view.parameters.currency})`), PAGE_MARGIN, document.y, { width });
  document.font('Helvetica').fontSize(7.5).fillColor(MUTED)
    .text(pdfText(`Costs = haul + processing + fixed. Ranks again with gold price and recovery moved by ${Math.round(view.sensitivityStep * 100)} % (down / up).`), { width });
  document.moveDown(0.3);
  const drawRow = (cells: readonly string[], isHeader: boolean) => {
    document.font(isHeader ? 'Helvetica-Bold' : 'Helvetica').fontSize(7.5).fillColor(INK);
    const heights = cells.map((cell, index) => document.heightOfString(pdfText(cell), { width: (PDF_COLUMNS[index]?.width ?? 40) - 4 }));
    const height = Math.max(...heights) + 4;
    if (document.y + height > document.page.height - PAGE_MARGIN - 12) {
      document.addPage();
    }
    const y = document.y;
    let x = PAGE_MARGIN;
    cells.forEach((cell, index) => {
      const columnWidth = PDF_COLUMNS[index]?.width ?? 40;
      document.text(pdfText(cell), x + 2, y + 2, { width: columnWidth - 4, align: index <= 1 ? 'left' : 'right' });
      x += columnWidth;
    });
    document.moveTo(PAGE_MARGIN, y + height).lineTo(PAGE_MARGIN + width, y + height).lineWidth(isHeader ? 1 : 0.3).stroke(isHeader ? INK : RULE);
    document.y = y + height;
  };
  drawRow(PDF_COLUMNS.map((column) => column.header), true);
  for (const row of view.rows) {
    drawRow(tableCells(view, row), false);
  }
  if (view.rows.length === 0) {
    document.font('Helvetica').fontSize(9).fillColor(MUTED).text('No piles are recorded at this site yet.', PAGE_MARGIN, document.y + 4);
  }
  document.x = PAGE_MARGIN;
  document.moveDown(0.8);
}

function heading(document: PDFKit.PDFDocument, title: string): void {
  if (document.y > document.page.height - PAGE_MARGIN - 60) document.addPage();
  document.font('Helvetica-Bold').fontSize(11).fillColor(INK).text(pdfText(title), PAGE_MARGIN, document.y);
  document.moveDown(0.2);
}

function thinDataList(document: PDFKit.PDFDocument, view: ShortlistView): void {
  const thin = view.rows.filter((row) => !row.isRankable);
  if (thin.length === 0) return;
  heading(document, 'Not ranked: data too thin');
  document.font('Helvetica').fontSize(8.5).fillColor(INK);
  for (const row of thin) {
    document.text(pdfText(`[!] ${row.code}: ${row.thinDataReasons.join('; ')}`), { indent: 6 });
  }
  document.moveDown(0.6);
}

function assumptionList(document: PDFKit.PDFDocument, view: ShortlistView): void {
  heading(document, 'Assumptions');
  document.font('Helvetica').fontSize(8.5).fillColor(INK);
  for (const assumption of view.assumptions) {
    document.text(pdfText(`- ${assumption}`), { indent: 6 });
  }
  document.moveDown(0.6);
}

function cautionList(document: PDFKit.PDFDocument, width: number): void {
  heading(document, 'Safety at the piles');
  for (const caution of CAUTIONS.filter((candidate) => ['mercury', 'silica-dust', 'unstable-face', 'cyanide'].includes(candidate.hazard))) {
    if (document.y > document.page.height - PAGE_MARGIN - 50) document.addPage();
    document.font('Helvetica-Bold').fontSize(9).fillColor(INK).text(pdfText(caution.title), PAGE_MARGIN, document.y, { width });
    document.font('Helvetica').fontSize(8.5).text(pdfText(caution.actions.join(' ')), { width });
    document.fontSize(7).fillColor(MUTED).text(pdfText(`Source: ${caution.source}`), { width });
    document.moveDown(0.3);
  }
  document.moveDown(0.3);
  document.font('Helvetica-Bold').fontSize(9).fillColor(INK).text(pdfText(PLANNING_ESTIMATE_STATEMENT), PAGE_MARGIN, document.y, { width });
}
