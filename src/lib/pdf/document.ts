/**
 * Shared PDF drawing with pdfkit: the bundled font (Roboto Flex, static 400 WOFF from
 * @fontsource/roboto-flex; fontkit cannot subset the variable WOFF2 files the pages use),
 * text made safe for the font's Latin subset, headings, key/value rows, the parcel map as
 * vector paths with a scale bar, and the risk shape.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { levelInfo } from '../rules/levels';
import { outlinePaths } from '../register/outline';

const require = createRequire(import.meta.url);
let fontBytes: Buffer | null = null;
const font = () =>
  (fontBytes ??= readFileSync(require.resolve('@fontsource/roboto-flex/files/roboto-flex-latin-400-normal.woff')));

// Code points of the font's "latin" subset (its unicode-range in @fontsource/roboto-flex/latin-400.css).
const COVERED: [number, number][] = [
  [0x20, 0x7e],
  [0xa0, 0xff],
  [0x131, 0x131],
  [0x152, 0x153],
  [0x2bb, 0x2bc],
  [0x2c6, 0x2c6],
  [0x2da, 0x2da],
  [0x2dc, 0x2dc],
  [0x2000, 0x206f],
  [0x20ac, 0x20ac],
  [0x2122, 0x2122],
  [0x2191, 0x2191],
  [0x2193, 0x2193],
  [0x2212, 0x2212],
  [0x2215, 0x2215],
];
const covered = (cp: number) => COVERED.some(([a, b]) => cp >= a && cp <= b);

/** The text with every character the font lacks replaced: accents dropped where that helps, else "?". */
export function pdfText(s: string): string {
  let out = '';
  for (const ch of s.replace(/\r\n?/g, '\n')) {
    const cp = ch.codePointAt(0)!;
    if (ch === '\n' || covered(cp)) out += ch;
    else if (cp === 0x2265) out += '>=';
    else if (cp === 0x2264) out += '<=';
    else if (cp === 0x2192) out += '->';
    else {
      const base = ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
      out += base && [...base].every((c) => covered(c.codePointAt(0)!)) ? base : '?';
    }
  }
  return out;
}

export type Pdf = PDFKit.PDFDocument;
export const INK = '#1d2320';
export const MUTED = '#55605a';
export const SWARD = '#245a41';
export const CLAY = '#9a3b1d';

export function newPdf(info: { title: string; subject: string }): { doc: Pdf; done: Promise<Buffer> } {
  const doc = new PDFDocument({
    size: 'A4',
    margin: 50,
    info: { Title: info.title, Subject: info.subject, Author: 'Swardkeep', Creator: 'Swardkeep' },
    bufferPages: true,
  });
  doc.registerFont('body', font());
  doc.font('body').fillColor(INK);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  return { doc, done };
}

export const contentWidth = (doc: Pdf) => doc.page.width - doc.page.margins.left - doc.page.margins.right;

export function ensureSpace(doc: Pdf, height: number): void {
  if (doc.y + height > doc.page.height - doc.page.margins.bottom) doc.addPage();
}

export function heading(doc: Pdf, text: string, size = 13): void {
  ensureSpace(doc, size * 3);
  doc
    .moveDown(0.6)
    .fontSize(size)
    .fillColor(SWARD)
    .text(pdfText(text), doc.page.margins.left, doc.y, { width: contentWidth(doc) })
    .fillColor(INK)
    .moveDown(0.2);
}

export function para(doc: Pdf, text: string, opts: { size?: number; color?: string } = {}): void {
  doc
    .fontSize(opts.size ?? 10)
    .fillColor(opts.color ?? INK)
    .text(pdfText(text), doc.page.margins.left, doc.y, { width: contentWidth(doc) })
    .fillColor(INK);
}

/** Rows of label: value, the label in a fixed column. */
export function rows(doc: Pdf, items: [string, string][], labelWidth = 130): void {
  const left = doc.page.margins.left;
  const width = contentWidth(doc) - labelWidth - 8;
  doc.fontSize(10);
  for (const [k, v] of items) {
    const h = Math.max(
      doc.heightOfString(pdfText(v), { width }),
      doc.heightOfString(pdfText(k), { width: labelWidth }),
    );
    ensureSpace(doc, h + 4);
    const y = doc.y;
    doc.fillColor(MUTED).text(pdfText(k), left, y, { width: labelWidth });
    doc.fillColor(INK).text(pdfText(v), left + labelWidth + 8, y, { width });
    doc.y = y + h + 3;
  }
}

export function bullets(doc: Pdf, items: string[], size = 10): void {
  doc.fontSize(size);
  for (const t of items) {
    ensureSpace(doc, size * 2);
    doc.text(`•  ${pdfText(t)}`, doc.page.margins.left + 6, doc.y, { width: contentWidth(doc) - 6 });
    doc.moveDown(0.15);
  }
}

type MultiPolygon = { type: 'MultiPolygon'; coordinates: number[][][][] };

/** The parcels as hatched vector outlines, north up, with a scale bar (same projection as the register page). */
export function parcelMap(doc: Pdf, geoms: MultiPolygon[], height = 210): void {
  const width = contentWidth(doc);
  ensureSpace(doc, height + 10);
  const x0 = doc.page.margins.left,
    y0 = doc.y;
  const map = outlinePaths(geoms, width, height, 30);
  doc.save().rect(x0, y0, width, height).fill('#eef5f0').restore();
  doc.save().translate(x0, y0);
  for (const d of map.paths) doc.path(d).fillOpacity(0.35).fillAndStroke(SWARD, '#15382a', 'even-odd');
  doc.restore();
  doc
    .save()
    .fillOpacity(1)
    .fillColor(INK)
    .fontSize(10)
    .text('N ↑', x0 + width - 40, y0 + 8, { width: 32, align: 'right' });
  if (map.scaleM) {
    const yb = y0 + height - 12;
    doc
      .moveTo(x0 + 12, yb)
      .lineTo(x0 + 12 + map.scaleM.px, yb)
      .lineWidth(2.5)
      .stroke(INK);
    doc.fontSize(9).text(`${map.scaleM.metres.toLocaleString('en')} m`, x0 + 12, yb - 13, { width: 120 });
  }
  doc.restore();
  doc.y = y0 + height + 4;
  doc.x = x0;
}

/** The risk level's shape (ring, diamond, triangle, barred square) and its words; the shape carries the level, not the colour. */
export function riskLine(doc: Pdf, level: number): void {
  const info = levelInfo(level);
  ensureSpace(doc, 20);
  const x = doc.page.margins.left,
    y = doc.y,
    s = 12;
  doc.save().lineWidth(1.6).strokeColor(INK).fillColor(INK);
  if (info.shape === 'ring') doc.circle(x + s / 2, y + s / 2, s / 2 - 1).stroke();
  else if (info.shape === 'diamond')
    doc.polygon([x + s / 2, y], [x + s, y + s / 2], [x + s / 2, y + s], [x, y + s / 2]).stroke();
  else if (info.shape === 'triangle') doc.polygon([x + s / 2, y], [x + s, y + s], [x, y + s]).fill();
  else {
    doc.rect(x, y, s, s).fill();
    doc
      .moveTo(x + 3, y + s / 2)
      .lineTo(x + s - 3, y + s / 2)
      .lineWidth(2)
      .stroke('#ffffff');
  }
  doc.restore();
  doc
    .fontSize(11)
    .fillColor(INK)
    .text(pdfText(`Risk level ${level} of 4: ${info.label}. ${info.meaning}`), x + s + 8, y, {
      width: contentWidth(doc) - s - 8,
    });
  doc.x = x;
}

/** Page numbers and a running footer on every page (needs bufferPages). */
export function footers(doc: Pdf, text: string): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc
      .fontSize(8)
      .fillColor(MUTED)
      .text(pdfText(`${text} · page ${i + 1} of ${range.count}`), doc.page.margins.left, doc.page.height - 32, {
        width: contentWidth(doc),
        align: 'center',
        lineBreak: false,
      });
    doc.page.margins.bottom = bottom;
  }
  doc.fillColor(INK);
}
