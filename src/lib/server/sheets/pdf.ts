import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { layoutSheet, SHEET_GEOMETRY, type LayoutEntry } from '~/lib/sheets/layout';
import { COLOUR_DISCLAIMER, formatLab } from '~/lib/sheets/format';
import type { PageSizeName } from '~/lib/sheets/requests';
import { safetyDeferral, shortCaution } from '~/lib/safety';
import { woffToSfnt } from './woff';
import { printedEntries, type SheetSwatchEntry, type SheetView } from './view';

/**
 * The print-ready PDF of a sheet, drawn with PDFKit from the layout of src/lib/sheets/layout.ts.
 * The app's own typefaces (IBM Plex Sans, Source Serif 4) are embedded from their installed
 * font packages; swatches are sRGB fills with their hex and CIELAB printed beside them.
 */

const require = createRequire(import.meta.url);
const fontFile = (pkg: string, file: string) => woffToSfnt(readFileSync(require.resolve(`@fontsource/${pkg}/files/${file}`)));

let fonts: Record<'sans' | 'sansBold' | 'serif' | 'serifBold', Buffer> | undefined;
function loadFonts() {
  fonts ??= {
    sans: fontFile('ibm-plex-sans', 'ibm-plex-sans-latin-400-normal.woff'),
    sansBold: fontFile('ibm-plex-sans', 'ibm-plex-sans-latin-600-normal.woff'),
    serif: fontFile('source-serif-4', 'source-serif-4-latin-400-normal.woff'),
    serifBold: fontFile('source-serif-4', 'source-serif-4-latin-600-normal.woff'),
  };
  return fonts;
}

const INK = '#1c1917';
const MUTED = '#57534e';
const RULE = '#a8a29e';
const SWATCH = 54;
const LINE = 11;

function drawSwatch(doc: PDFKit.PDFDocument, entry: SheetSwatchEntry, x: number, y: number) {
  const { cellWidth, cellHeight } = SHEET_GEOMETRY;
  doc.rect(x, y, SWATCH, SWATCH).fillColor(entry.hex).fill();
  doc.rect(x, y, SWATCH, SWATCH).lineWidth(0.5).strokeColor(RULE).stroke();
  const textX = x + SWATCH + 8;
  const textWidth = cellWidth - SWATCH - 8;
  doc.font('sansBold').fontSize(9).fillColor(INK).text(entry.hex.toUpperCase(), textX, y, { width: textWidth, lineBreak: false });
  const [l, a, b] = formatLab(entry.lab).split('  ');
  doc
    .font('sans')
    .fontSize(7.5)
    .fillColor(MUTED)
    .text(`${l}\n${a}  ${b}`, textX, y + 12, { width: textWidth, height: 20, lineGap: 0.5 });
  if (entry.prediction) {
    doc
      .rect(textX, y + 34, 20, 20)
      .fillColor(entry.prediction.hex)
      .fill();
    doc
      .rect(textX, y + 34, 20, 20)
      .lineWidth(0.5)
      .strokeColor(RULE)
      .stroke();
    doc
      .font('sans')
      .fontSize(6.5)
      .fillColor(MUTED)
      .text(`${entry.prediction.note}: ${entry.prediction.name}`, textX + 24, y + 35, { width: textWidth - 24, height: 20, ellipsis: true });
  }
  let lineY = y + SWATCH + 6;
  // One line each; a long laminate name is cut with an ellipsis rather than pushed into the caption.
  for (const line of entry.lines) {
    doc.font('sans').fontSize(8).fillColor(INK).text(line, x, lineY, { width: cellWidth, height: LINE, ellipsis: true, lineBreak: false });
    lineY += LINE;
  }
  if (entry.caption) {
    const room = y + cellHeight - lineY;
    if (room > 9)
      doc
        .font('serif')
        .fontSize(8)
        .fillColor(INK)
        .text(entry.caption, x, lineY + 1, { width: cellWidth, height: room, ellipsis: true });
  }
}

function drawTitleBlock(doc: PDFKit.PDFDocument, sheet: SheetView, width: number) {
  const { margin, titleBlockHeight } = SHEET_GEOMETRY;
  const inner = width - 2 * margin;
  doc.font('serifBold').fontSize(20).fillColor(INK).text(sheet.title, margin, margin, { width: inner, height: 28, ellipsis: true, lineBreak: false });
  const meta = [
    sheet.className ? `Class: ${sheet.className}` : null,
    sheet.ownerName ? `Instructor: ${sheet.ownerName}` : null,
    `Temperatures in ${sheet.units === 'f' ? '°F' : '°C'}`,
    sheet.showPrediction ? 'Small squares: the model for the same heat' : null,
  ].filter(Boolean);
  // Up to two lines of who and what, then the introduction under them.
  doc.font('sans').fontSize(8.5).fillColor(MUTED);
  const metaText = meta.join('  ·  ');
  const metaHeight = Math.min(doc.heightOfString(metaText, { width: inner }), 24);
  doc.text(metaText, margin, margin + 30, { width: inner, height: 24, ellipsis: true });
  if (sheet.intro) {
    const introTop = margin + 30 + metaHeight + 8;
    doc
      .font('serif')
      .fontSize(10)
      .fillColor(INK)
      .text(sheet.intro, margin, introTop, { width: inner, height: margin + titleBlockHeight - 14 - introTop, ellipsis: true, lineGap: 1.5 });
  }
  doc
    .moveTo(margin, margin + titleBlockHeight - 10)
    .lineTo(width - margin, margin + titleBlockHeight - 10)
    .lineWidth(0.75)
    .strokeColor(RULE)
    .stroke();
}

function drawFooter(doc: PDFKit.PDFDocument, width: number, height: number, page: number, pages: number) {
  const { margin, footerHeight } = SHEET_GEOMETRY;
  const top = height - margin - footerHeight + 8;
  const inner = width - 2 * margin;
  doc
    .moveTo(margin, top)
    .lineTo(width - margin, top)
    .lineWidth(0.5)
    .strokeColor(RULE)
    .stroke();
  doc
    .font('sansBold')
    .fontSize(7)
    .fillColor(INK)
    .text('Safety', margin, top + 5, { width: 40, lineBreak: false });
  doc
    .font('sans')
    .fontSize(7)
    .fillColor(INK)
    .text(`${shortCaution} ${safetyDeferral}`, margin + 34, top + 5, { width: inner - 34, height: 36, ellipsis: true, lineGap: 0.5 });
  doc.fillColor(MUTED).text(COLOUR_DISCLAIMER, margin, top + 44, { width: inner - 40, height: 10, ellipsis: true, lineBreak: false });
  doc.text(`${page} / ${pages}`, width - margin - 36, top + 44, { width: 36, align: 'right', lineBreak: false });
}

/** The sheet as PDF bytes, on the page size asked for (the sheet's own by default). */
export async function renderSheetPdf(sheet: SheetView, size: PageSizeName = sheet.pageSize): Promise<Buffer> {
  const entries: LayoutEntry<SheetSwatchEntry>[] = printedEntries(sheet).map((entry) =>
    entry.kind === 'heading' ? { kind: 'heading', text: entry.text } : { kind: 'swatch', item: entry },
  );
  const pages = layoutSheet(entries, size, sheet.orientation);
  const { sans, sansBold, serif, serifBold } = loadFonts();
  const doc = new PDFDocument({
    autoFirstPage: false,
    font: sans as unknown as string,
    margin: 0,
    info: { Title: sheet.title, Author: sheet.ownerName ?? 'Oxbloom', Subject: 'Colour sheet', Creator: 'Oxbloom' },
  });
  doc.registerFont('sans', sans);
  doc.registerFont('sansBold', sansBold);
  doc.registerFont('serif', serif);
  doc.registerFont('serifBold', serifBold);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  pages.forEach((page, index) => {
    doc.addPage({ size: [page.width, page.height], margin: 0 });
    if (index === 0) drawTitleBlock(doc, sheet, page.width);
    for (const entry of page.entries) {
      if (entry.kind === 'heading') {
        doc
          .font('serifBold')
          .fontSize(13)
          .fillColor(INK)
          .text(entry.text, entry.x, entry.y + 6, { width: entry.width, height: 18, ellipsis: true, lineBreak: false });
      } else drawSwatch(doc, entry.item, entry.x, entry.y);
    }
    drawFooter(doc, page.width, page.height, index + 1, pages.length);
  });
  doc.end();
  return done;
}
