import 'server-only';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { formatMoney } from '@/lib/money';
import { addressLines } from '@/lib/orders/notify';
import { needsCustomsDeclaration } from '@/lib/settings/shipping-rules';
import type { StudioSettings } from '@/lib/settings/studio';
import type { SlipLine, SlipOrder } from './packing-slips';

// DejaVu Sans covers Latin, Greek and Cyrillic, so every buyer's name and address prints as written;
// pdfkit embeds the subset of glyphs used.
const fontDir = () => path.join(process.cwd(), 'node_modules', 'dejavu-fonts-ttf', 'ttf');
const REGULAR = 'body';
const BOLD = 'bold';

// A4 is 210 × 297 mm = 595.28 × 841.89 pt (ISO 216); pdfkit knows it as 'A4'. 15 mm margins leave room
// for printers that cannot print to the edge (common practice, no source).
const MARGIN = 42.5;
const PAGE_WIDTH = 595.28;
const PAGE_HEIGHT = 841.89;
const CONTENT_WIDTH = PAGE_WIDTH - 2 * MARGIN;
// The footer sits inside the bottom margin, so the body may run down to here before a new page starts.
const BODY_BOTTOM = PAGE_HEIGHT - MARGIN - 24;
const TEXT = 10.5;
const SMALL = 9;
const INK = '#1c1a17';
const MUTED = '#5c574f';
const RULE = '#b9b2a6';

type Doc = PDFKit.PDFDocument;
type Column = { title: string; width: number; align?: 'left' | 'right' | 'center' };

const grams = (g: number) => `${new Intl.NumberFormat('en-IE').format(g)} g`;
const withCode = (amountMinor: number, currency: string) => `${formatMoney({ amountMinor, currency })} ${currency}`;
const regionName = (code: string) => new Intl.DisplayNames(['en'], { type: 'region' }).of(code) ?? code;

function orderDate(order: SlipOrder, timeZone: string): string {
  return new Intl.DateTimeFormat('en-IE', { day: 'numeric', month: 'long', year: 'numeric', timeZone }).format(order.paidAt ?? order.placedAt);
}

/** The studio's address lines, without repeating its name where the address already starts with it. */
function senderLines(settings: StudioSettings): string[] {
  const lines = settings.postalAddress.split(/\r?\n/).map((l) => l.trim()).filter(Boolean);
  return lines[0] === settings.name ? lines : [settings.name, ...lines];
}

function recipient(order: SlipOrder): { name: string; lines: string[] } {
  return { name: order.shipTo?.name?.trim() || order.buyerName?.trim() || order.email, lines: addressLines(order.shipTo) };
}

function newPage(doc: Doc) {
  doc.addPage({ size: 'A4', margin: MARGIN });
  doc.fillColor(INK).font(REGULAR, TEXT);
}

/** Starts a fresh page when `height` more points would run into the footer; true when it did. */
function ensureRoom(doc: Doc, height: number): boolean {
  if (doc.y + height <= BODY_BOTTOM) return false;
  newPage(doc);
  return true;
}

function heading(doc: Doc, title: string, order: SlipOrder, settings: StudioSettings) {
  const top = doc.y;
  doc.font(BOLD, 20).fillColor(INK).text(title, MARGIN, top, { width: CONTENT_WIDTH * 0.7 });
  const after = doc.y;
  doc.font(BOLD, 13).text(`Order ${order.number}`, MARGIN, top + 2, { width: CONTENT_WIDTH, align: 'right' });
  doc.font(REGULAR, TEXT).fillColor(MUTED).text(`Placed ${orderDate(order, settings.timeZone)}`, { width: CONTENT_WIDTH, align: 'right' });
  doc.fillColor(INK);
  doc.y = Math.max(after, doc.y) + 14;
  rule(doc);
}

function rule(doc: Doc) {
  doc.moveTo(MARGIN, doc.y).lineTo(PAGE_WIDTH - MARGIN, doc.y).lineWidth(0.75).strokeColor(RULE).stroke();
  doc.y += 12;
}

/** Two labelled blocks of lines side by side ("From" and "Ship to"). */
function addressBlocks(doc: Doc, blocks: { label: string; lines: string[]; strongFirst?: boolean }[]) {
  const top = doc.y;
  const width = (CONTENT_WIDTH - 24) / blocks.length;
  let bottom = top;
  blocks.forEach((block, index) => {
    const x = MARGIN + index * (width + 24);
    doc.font(BOLD, SMALL).fillColor(MUTED).text(block.label.toUpperCase(), x, top, { width, characterSpacing: 0.6 });
    doc.moveDown(0.3).fillColor(INK);
    block.lines.forEach((line, i) => doc.font(i === 0 && block.strongFirst ? BOLD : REGULAR, i === 0 && block.strongFirst ? 12 : TEXT).text(line, x, doc.y, { width }));
    bottom = Math.max(bottom, doc.y);
  });
  doc.x = MARGIN;
  doc.y = bottom + 16;
}

function labelled(doc: Doc, label: string, value: string) {
  doc.font(BOLD, TEXT).text(`${label}: `, MARGIN, doc.y, { continued: true, width: CONTENT_WIDTH }).font(REGULAR).text(value);
}

function tableHeader(doc: Doc, columns: Column[]) {
  const top = doc.y;
  let x = MARGIN;
  doc.font(BOLD, SMALL).fillColor(MUTED);
  for (const column of columns) {
    doc.text(column.title, x + 4, top, { width: column.width - 8, align: column.align ?? 'left' });
    x += column.width;
  }
  doc.fillColor(INK);
  doc.y = Math.max(doc.y, top + 12) + 4;
  rule(doc);
  doc.y -= 6;
}

/** One table row; a row that would run into the footer goes to a new page with the header repeated. */
function tableRow(doc: Doc, columns: Column[], cells: (string | ((x: number, y: number) => void))[], minHeight = 22) {
  doc.font(REGULAR, TEXT);
  const heights = cells.map((cell, i) =>
    typeof cell === 'string' ? doc.heightOfString(cell, { width: columns[i]!.width - 8 }) : 0,
  );
  const height = Math.max(minHeight, ...heights.map((h) => h + 10));
  if (ensureRoom(doc, height)) tableHeader(doc, columns);
  const top = doc.y;
  let x = MARGIN;
  cells.forEach((cell, i) => {
    const column = columns[i]!;
    if (typeof cell === 'string') doc.font(REGULAR, TEXT).text(cell, x + 4, top + 5, { width: column.width - 8, align: column.align ?? 'left' });
    else cell(x, top);
    x += column.width;
  });
  doc.y = top + height;
  doc.moveTo(MARGIN, doc.y).lineTo(PAGE_WIDTH - MARGIN, doc.y).lineWidth(0.5).strokeColor(RULE).stroke();
  doc.x = MARGIN;
}

function tickBox(doc: Doc, x: number, y: number, width: number) {
  const size = 13;
  doc.rect(x + (width - size) / 2, y + 4.5, size, size).lineWidth(1).strokeColor(INK).stroke();
}

function signatureLines(doc: Doc, left: string, right: string) {
  ensureRoom(doc, 60);
  doc.y += 28;
  const y = doc.y;
  const wide = CONTENT_WIDTH * 0.58;
  doc.moveTo(MARGIN, y).lineTo(MARGIN + wide, y).lineWidth(0.75).strokeColor(INK).stroke();
  doc.moveTo(MARGIN + wide + 24, y).lineTo(PAGE_WIDTH - MARGIN, y).stroke();
  doc.font(REGULAR, SMALL).fillColor(MUTED);
  doc.text(left, MARGIN, y + 4, { width: wide });
  doc.text(right, MARGIN + wide + 24, y + 4, { width: CONTENT_WIDTH - wide - 24 });
  doc.fillColor(INK);
  doc.x = MARGIN;
}

function packingSlip(doc: Doc, order: SlipOrder, settings: StudioSettings) {
  heading(doc, 'Packing slip', order, settings);
  const to = recipient(order);
  addressBlocks(doc, [
    { label: 'From', lines: senderLines(settings), strongFirst: true },
    { label: 'Ship to', lines: [to.name, ...to.lines], strongFirst: true },
  ]);
  if (order.buyerName && order.buyerName.trim() !== to.name) labelled(doc, 'Ordered by', order.buyerName.trim());
  labelled(doc, 'Shipping', order.shippingLabel);
  const masks = order.lines.length;
  labelled(doc, 'In this parcel', `${masks} ${masks === 1 ? 'mask' : 'masks'}`);
  if (order.buyerNote) labelled(doc, 'Note from the buyer', order.buyerNote);
  doc.moveDown(1);

  const columns: Column[] = [
    { title: 'Packed', width: 52, align: 'center' },
    { title: '#', width: 30 },
    { title: 'Design', width: 175 },
    { title: 'Finish', width: 175 },
    { title: 'Qty', width: CONTENT_WIDTH - 432, align: 'right' },
  ];
  tableHeader(doc, columns);
  for (const line of order.lines) {
    tableRow(doc, columns, [(x, y) => tickBox(doc, x, y, 52), String(line.position), line.designName, line.finishName, '1'], 24);
  }
  doc.moveDown(1.2);
  ensureRoom(doc, 40);
  doc.font(REGULAR, SMALL).fillColor(MUTED)
    .text('Tick each mask as it goes in the box. Check the order number against the parcel label before sealing.', MARGIN, doc.y, { width: CONTENT_WIDTH });
  if (settings.contactEmail) doc.text(`Questions about this order: ${settings.contactEmail}, quoting ${order.number}.`, { width: CONTENT_WIDTH });
  doc.fillColor(INK);
  signatureLines(doc, 'Packed by', 'Date');
}

function declarationLineText(line: SlipLine, settings: StudioSettings) {
  return `${settings.customs.description}: ${line.designName}, ${line.finishName}`;
}

function customsSummary(doc: Doc, order: SlipOrder, settings: StudioSettings) {
  heading(doc, 'Customs declaration summary', order, settings);
  doc.font(REGULAR, SMALL).fillColor(MUTED)
    .text("The details for this parcel's customs declaration, to copy onto the carrier's form or attach to the parcel.", { width: CONTENT_WIDTH });
  doc.fillColor(INK).moveDown(1);
  const to = recipient(order);
  addressBlocks(doc, [
    { label: 'Sender', lines: [...senderLines(settings), ...(settings.contactEmail ? [settings.contactEmail] : [])], strongFirst: true },
    { label: 'Recipient', lines: [to.name, ...to.lines, ...(order.email ? [order.email] : [])], strongFirst: true },
  ]);

  labelled(doc, 'Nature of the shipment', 'Sale of goods');
  labelled(doc, 'Contents', settings.customs.description);
  labelled(doc, 'HS code', settings.customs.hsCode ?? '');
  const origin = settings.customs.originCountry ?? '';
  labelled(doc, 'Country of origin', `${regionName(origin)} (${origin})`);
  labelled(doc, 'Destination', `${regionName(order.shippingCountry)} (${order.shippingCountry})`);
  doc.moveDown(1);

  const columns: Column[] = [
    { title: 'Description', width: 230 },
    { title: 'Qty', width: 40, align: 'right' },
    { title: 'Net weight', width: 90, align: 'right' },
    { title: `Value (${order.currency})`, width: CONTENT_WIDTH - 360, align: 'right' },
  ];
  tableHeader(doc, columns);
  for (const line of order.lines) {
    const weight = line.netWeightG === null ? 'not recorded' : `${grams(line.netWeightG)}${line.netWeightIsPacked ? ' *' : ''}`;
    tableRow(doc, columns, [declarationLineText(line, settings), '1', weight, withCode(line.unitPriceMinor, order.currency)]);
  }

  const valueMinor = order.lines.reduce((sum, line) => sum + line.unitPriceMinor, 0);
  const known = order.lines.every((line) => line.netWeightG !== null);
  const netG = order.lines.reduce((sum, line) => sum + (line.netWeightG ?? 0), 0);
  ensureRoom(doc, 110);
  doc.moveDown(0.8);
  labelled(doc, 'Total quantity', String(order.lines.length));
  labelled(doc, 'Total net weight', known ? grams(netG) : 'not recorded for every mask');
  labelled(doc, 'Total gross weight', order.grossWeightG === null ? 'not recorded for every mask' : grams(order.grossWeightG));
  labelled(doc, 'Total value', withCode(valueMinor, order.currency));
  labelled(doc, 'Postage charged', withCode(order.shippingMinor, order.currency));
  if (order.lines.some((line) => line.netWeightIsPacked)) {
    doc.moveDown(0.4).font(REGULAR, SMALL).fillColor(MUTED)
      .text("* The mask's own weight is not recorded for this design, so its packed weight is shown.", { width: CONTENT_WIDTH });
    doc.fillColor(INK);
  }

  doc.moveDown(1.2);
  ensureRoom(doc, 90);
  doc.font(REGULAR, TEXT).text(
    'I confirm that the details given above are correct and that this parcel holds no dangerous goods or goods forbidden by law or by postal or customs rules.',
    MARGIN, doc.y, { width: CONTENT_WIDTH },
  );
  signatureLines(doc, `Signature, for ${settings.name}`, 'Date');
}

/** "DM-1001 · Page 1 of 2" on each of an order's pages, written once its page count is known. */
function footers(doc: Doc, order: SlipOrder, first: number, count: number) {
  for (let i = 0; i < count; i += 1) {
    doc.switchToPage(first + i);
    // Inside the bottom margin: lift it for the footer, or pdfkit would start a page of its own.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font(REGULAR, SMALL).fillColor(MUTED)
      .text(`${order.number} · Page ${i + 1} of ${count}`, MARGIN, PAGE_HEIGHT - MARGIN - 10, { width: CONTENT_WIDTH, align: 'right', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}

/**
 * One PDF for all the orders, in the order given: each order's packing slip and, when its parcel leaves
 * the studio's customs area, its customs declaration summary. Page numbers count each order's own pages.
 * Call assertPrintable first: this trusts that the settings can fill every declaration.
 */
export async function renderPackingSlips(orders: readonly SlipOrder[], settings: StudioSettings): Promise<Buffer> {
  const fonts = fontDir();
  const doc = new PDFDocument({
    size: 'A4',
    margin: MARGIN,
    autoFirstPage: false,
    bufferPages: true,
    font: path.join(fonts, 'DejaVuSans.ttf'),
    info: { Title: orders.length === 1 ? `Packing slip ${orders[0]!.number}` : `Packing slips (${orders.length} orders)`, Author: settings.name },
    lang: 'en-IE',
    displayTitle: true,
  });
  doc.registerFont(REGULAR, path.join(fonts, 'DejaVuSans.ttf'));
  doc.registerFont(BOLD, path.join(fonts, 'DejaVuSans-Bold.ttf'));
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const ranges: { order: SlipOrder; first: number; count: number }[] = [];
  for (const order of orders) {
    const first = doc.bufferedPageRange().count;
    newPage(doc);
    packingSlip(doc, order, settings);
    if (needsCustomsDeclaration(settings.customs.area, settings.country, order.shippingCountry)) {
      newPage(doc);
      customsSummary(doc, order, settings);
    }
    ranges.push({ order, first, count: doc.bufferedPageRange().count - first });
  }
  for (const range of ranges) footers(doc, range.order, range.first, range.count);
  doc.end();
  return done;
}
