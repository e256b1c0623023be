/** The GSD-along-the-line chart of the PDF report, drawn with pdfkit vector paths, and its pure axis arithmetic. */
import type PDFDocument from 'pdfkit';
import type { ReportLine } from '../../contracts/reports';
import { niceTicks } from '../../contracts/format/ticks';


/** Colours and strokes of the chart: a palette of our own with distinct lightness, so it also reads in grey. */
const ink = { axis: '#3a3f44', grid: '#d5d9dd', band: '#e4efe6', line: '#1d4e89', unknown: '#b0302a', text: '#3a3f44' };

/**
 * Draw the chart of one line at (x, y), `w` x `h` points: the target band shaded, the GSD polyline (broken where
 * the ground is unknown, which is marked along the bottom), axes with units.
 */
export function drawGsdChart(
  doc: InstanceType<typeof PDFDocument>,
  line: ReportLine,
  band: [number, number],
  box: { x: number; y: number; w: number; h: number },
): void {
  const left = box.x + 40;
  const bottom = box.y + box.h - 24;
  const right = box.x + box.w - 6;
  const top = box.y + 16;
  const known = line.gsdSeries.filter((p) => p.gsdCm !== null).map((p) => p.gsdCm as number);
  const xs = line.gsdSeries.map((p) => p.distanceM);
  const yTicks = niceTicks(Math.min(band[0], ...known), Math.max(band[1], ...known), 4);
  const xTicks = niceTicks(xs.length ? Math.min(...xs) : 0, xs.length ? Math.max(...xs) : 1, 6);
  const [y0, y1] = [yTicks[0], yTicks[yTicks.length - 1]];
  const [x0, x1] = [xTicks[0], xTicks[xTicks.length - 1]];
  const px = (d: number) => left + ((d - x0) / (x1 - x0)) * (right - left);
  const py = (g: number) => bottom - ((g - y0) / (y1 - y0)) * (bottom - top);

  doc.save();
  doc.rect(left, py(band[1]), right - left, py(band[0]) - py(band[1])).fill(ink.band);
  doc.lineWidth(0.5).strokeColor(ink.grid);
  for (const t of yTicks) doc.moveTo(left, py(t)).lineTo(right, py(t)).stroke();
  doc.lineWidth(0.8).strokeColor(ink.axis);
  doc.moveTo(left, top).lineTo(left, bottom).lineTo(right, bottom).stroke();

  doc.font('Inter').fontSize(7).fillColor(ink.text);
  for (const t of yTicks) doc.text(t.toFixed(2), box.x, py(t) - 3.5, { width: 36, align: 'right', lineBreak: false });
  for (const t of xTicks) doc.text(String(Math.round(t)), px(t) - 20, bottom + 3, { width: 40, align: 'center', lineBreak: false });
  doc.text('GSD (cm)', box.x, box.y, { width: 60, align: 'left', lineBreak: false });
  doc.text('distance along the line (m)', left, bottom + 12, { width: right - left, align: 'center', lineBreak: false });

  doc.lineWidth(1.2).strokeColor(ink.line);
  let drawing = false;
  for (const p of line.gsdSeries) {
    if (p.gsdCm === null) {
      if (drawing) doc.stroke();
      drawing = false;
      doc.save().lineWidth(2).strokeColor(ink.unknown).moveTo(px(p.distanceM), bottom - 3).lineTo(px(p.distanceM), bottom).stroke().restore();
      continue;
    }
    if (!drawing) doc.moveTo(px(p.distanceM), py(p.gsdCm));
    else doc.lineTo(px(p.distanceM), py(p.gsdCm));
    drawing = true;
  }
  if (drawing) doc.stroke();
  doc.restore();
}
