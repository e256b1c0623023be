/** The compliance report as a PDF (pdfkit, Inter fonts shipped in node_modules): the same figures as the JSON report. */
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import type { ComplianceReport } from '../../contracts/reports';
import { drawGsdChart } from './report.chart';
import { fmt } from '../../contracts/format/figures';
import { areaWords, shareWords } from '../../contracts/coverage-words';

const require = createRequire(import.meta.url);
/** Font files from the @expo-google-fonts/inter package (SIL Open Font License), embedded as subsets. */
const fonts = {
  Inter: require.resolve('@expo-google-fonts/inter/400Regular/Inter_400Regular.ttf'),
  'Inter-Bold': require.resolve('@expo-google-fonts/inter/700Bold/Inter_700Bold.ttf'),
};

type Doc = InstanceType<typeof PDFDocument>;
const page = { margin: 48, width: 595.28 - 96 }; // A4 in points, minus the margins
const grey = '#5b6168';

/** File name of a version's report, e.g. "north-ridge-v3-compliance.pdf". */
export function reportFileName(r: Pick<ComplianceReport, 'plan' | 'version'>): string {
  const slug = r.plan.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'plan';
  return `${slug}-v${r.version.number}-compliance.pdf`;
}

/** The lowest y that text may reach on the current page before pdfkit breaks to a new one. */
function pageBottom(doc: Doc): number {
  return doc.page.height - doc.page.margins.bottom;
}

function heading(doc: Doc, text: string): void {
  if (doc.y > pageBottom(doc) - 60) doc.addPage();
  doc.moveDown(0.8).font('Inter-Bold').fontSize(12).fillColor('black').text(text, page.margin, doc.y);
  doc.moveDown(0.3).font('Inter').fontSize(9);
}

/** A table of rows; the first row is the header (bold). Widths are fractions of the text width. */
function table(doc: Doc, rows: string[][], widths: number[]): void {
  const total = widths.reduce((a, b) => a + b, 0);
  const cols = widths.map((w) => (w / total) * page.width);
  for (let r = 0; r < rows.length; r++) {
    doc.font(r === 0 ? 'Inter-Bold' : 'Inter').fontSize(8.5);
    const h = Math.max(...rows[r].map((cell, c) => doc.heightOfString(cell, { width: cols[c] - 6 }))) + 4;
    if (doc.y + h > pageBottom(doc)) doc.addPage();
    const y = doc.y;
    let x = page.margin;
    rows[r].forEach((cell, c) => {
      doc.fillColor(r === 0 ? 'black' : '#1b1e21').text(cell, x, y + 2, { width: cols[c] - 6 });
      x += cols[c];
    });
    doc.y = y + h;
    doc.moveTo(page.margin, doc.y).lineTo(page.margin + page.width, doc.y).lineWidth(0.3).strokeColor('#c9ced3').stroke();
  }
  doc.x = page.margin;
}

function paragraphs(doc: Doc, items: string[], bullet = '•'): void {
  doc.font('Inter').fontSize(9).fillColor('#1b1e21');
  for (const t of items) doc.text(`${bullet} ${t}`, page.margin, doc.y, { width: page.width }).moveDown(0.2);
}

/** The ground proof: the spec in every cell, per item, the printed map with its legend in words, the largest shortfalls. */
function groundProof(doc: Doc, r: ComplianceReport, map: Buffer | null): void {
  const c = r.coverage;
  heading(doc, 'Ground proof: the spec in every ground cell');
  if (c.state !== 'ready') {
    doc.font('Inter-Bold').fontSize(9).fillColor('#8a4b00').text(c.note, page.margin, doc.y, { width: page.width });
    return;
  }
  doc.font('Inter').fontSize(9).fillColor('#1b1e21').text(`Spec: ${c.spec} (${c.cellM} m cells over ${areaWords(c.areaM2 ?? 0)}).`, page.margin, doc.y, { width: page.width });
  doc.fontSize(8.5).fillColor(grey).text(c.note, { width: page.width }).moveDown(0.3);
  table(doc, [['Item', 'Share of the area', 'Short'], ...c.items.map((it) => [it.title, shareWords(it.share), it.failingAreaM2 > 0 ? areaWords(it.failingAreaM2) : 'none'])], [3, 1.3, 1.3]);
  doc.moveDown(0.3).font('Inter-Bold').fontSize(9).fillColor('#1b1e21').text(`Every item met on ${shareWords(c.shareAll ?? 0)} of the area.`, page.margin);
  if (map) {
    const h = 300;
    if (doc.y + h + 40 > pageBottom(doc)) doc.addPage();
    const y = doc.y + 6;
    doc.image(map, page.margin, y, { fit: [page.width, h], align: 'center' });
    doc.y = y + h + 4;
    doc.x = page.margin;
    doc.font('Inter').fontSize(8).fillColor(grey).text(
      'Map: finest GSD among the views of each cell, light yellow finest to dark purple coarsest (viridis, from 0 to twice the spec). Dark diagonal stripes: cells short of the spec on at least one item. White: outside the survey area. North up.',
      { width: page.width },
    );
  }
  if (c.patches.length) {
    doc.moveDown(0.4);
    table(doc, [['Largest shortfalls', 'Area', 'Centre (WGS 84)'], ...c.patches.map((p) => [p.message, areaWords(p.areaM2), `${p.lat.toFixed(5)}, ${p.lon.toFixed(5)}`])], [4, 1, 1.6]);
    if (c.patchCount > c.patches.length) doc.font('Inter').fontSize(8).fillColor(grey).text(`${c.patchCount - c.patches.length} smaller patches are in the coverage raster (downloadable as a GeoTIFF).`, page.margin);
  }
}

/** The latest check of the photos as flown, next to the plan's figures; a line saying none was made otherwise. */
function asFlownSection(doc: Doc, r: ComplianceReport): void {
  const a = r.asFlown;
  heading(doc, 'As flown: what the photos covered');
  if (!a) {
    doc.font('Inter').fontSize(9).fillColor(grey).text('No photos of this version have been checked as flown yet; the figures above are the plan\'s.', page.margin, doc.y, { width: page.width });
    return;
  }
  doc.font('Inter').fontSize(8.5).fillColor(grey).text(`Latest of ${a.checkCount} check${a.checkCount === 1 ? '' : 's'}: ${a.label}, ${a.photoCount} photos, checked by ${a.checkedBy ?? 'a former member'} on ${fmt.utc(a.checkedAt)}.`, page.margin, doc.y, { width: page.width });
  doc.moveDown(0.3).font('Inter-Bold').fontSize(9).fillColor('#1b1e21').text(`Whole spec met on ${shareWords(a.shareAllFlown)} of the area as flown (${shareWords(a.shareAllPlanned)} as planned).`, page.margin);
  doc.moveDown(0.3);
  table(doc, [['Item', 'As flown', 'As planned'], ...a.items.map((it) => [it.title, shareWords(it.flown), shareWords(it.planned)])], [3, 1.3, 1.3]);
  doc.moveDown(0.3);
  paragraphs(doc, [
    `${a.matched} photos on planned stations; ${a.missedTriggers} missed trigger${a.missedTriggers === 1 ? '' : 's'}${a.missedRuns.length ? ` (${a.missedRuns.join('; ')})` : ''}; ${a.extraPhotos} extra photos.`,
    ...(a.offTrack.length ? [`Flown off track: ${a.offTrack.join('; ')}.`] : []),
    `Ground that met the spec as planned but not as flown: ${areaWords(a.lostAreaM2)}.`,
    a.reflight,
  ]);
  if (a.map) {
    const h = 300;
    if (doc.y + h + 60 > pageBottom(doc)) doc.addPage();
    const y = doc.y + 6;
    doc.image(Buffer.from(a.map.pngBase64, 'base64'), page.margin, y, { fit: [page.width, h], align: 'center' });
    doc.y = y + h + 4;
    doc.x = page.margin;
    doc.font('Inter').fontSize(8).fillColor(grey).text(`Map as flown: ${a.map.legend.map((l) => `${l.name}: ${l.words}`).join('; ')}. ${a.map.note}`, { width: page.width });
    doc.moveDown(0.3);
  }
  doc.font('Inter').fontSize(8).fillColor(grey).text(a.heights, page.margin, doc.y, { width: page.width });
}


/** Render the report to PDF bytes; `coverageMap` is the printed coverage map of a ready coverage run. */
export async function renderReportPdf(r: ComplianceReport, extras: { coverageMap?: Buffer | null } = {}): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: page.margin,
    bufferPages: true,
    info: {
      Title: `Compliance report: ${r.plan.name} v${r.version.number}`,
      Author: 'Loftline',
      Subject: `${r.project.name} (${r.project.client})`,
      CreationDate: new Date(r.generatedAt),
    },
  });
  for (const [name, file] of Object.entries(fonts)) doc.registerFont(name, file);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  doc.font('Inter-Bold').fontSize(18).text('Compliance report');
  doc.font('Inter').fontSize(10).fillColor(grey);
  doc.text(`${r.project.name} · client ${r.project.client || '–'} · plan ${r.plan.name} · version ${r.version.number}`);
  doc.text(`Analysed ${fmt.utc(r.version.analysedAt)} · report made ${fmt.utc(r.generatedAt)}`);

  heading(doc, 'Sign-off');
  doc.font('Inter-Bold').fontSize(10).fillColor(r.signOff.state === 'signed_off' ? '#1f5130' : '#8a4b00').text(r.signOff.statement);
  doc.font('Inter').fontSize(9).fillColor('#1b1e21');
  doc.text(`Signed off by: ${r.signOff.signedOffBy ?? '–'}    Date: ${fmt.utc(r.signOff.signedOffAt)}    Version: ${r.version.number}`);
  if (r.signOff.reasons.length) {
    // A client reading "DOES NOT MEET" under a signature sees, beside it, why the surveyor let the plan fly.
    doc.moveDown(0.3).font('Inter-Bold').fontSize(9.5).fillColor('#8a4b00').text('Signed off although these requirements are unmet — the surveyor’s reasons:');
    for (const x of r.signOff.reasons) {
      doc.font('Inter-Bold').fontSize(9).fillColor('#1b1e21').text(`${x.label} (required ${x.required}; achieved ${x.achieved})`, { indent: 10 });
      doc.font('Inter').fontSize(9).text(x.reason, { indent: 20 });
    }
  }

  if (r.flown) {
    // after the flight: the confirmation as flown, or that it is still owed where the team requires it
    doc.moveDown(0.3).font('Inter-Bold').fontSize(9.5).fillColor(r.flown.confirmedAt ? '#1f5130' : r.flown.required ? '#8a4b00' : grey).text(r.flown.statement, page.margin, doc.y, { width: page.width });
    if (r.flown.reasons.length) {
      doc.font('Inter-Bold').fontSize(9).fillColor('#8a4b00').text('Confirmed as flown although the flight lost ground on these items — the surveyor’s reasons:');
      for (const x of r.flown.reasons) {
        doc.font('Inter-Bold').fontSize(9).fillColor('#1b1e21').text(x.label, { indent: 10 });
        doc.font('Inter').fontSize(9).text(x.reason, { indent: 20 });
      }
    }
  }

  heading(doc, 'The client’s spec against the plan');
  table(doc, [['Requirement', 'Required', 'Achieved', 'Result'], ...r.checks.map((c) => [c.label, c.required, c.achieved, c.pass ? 'meets' : 'DOES NOT MEET'])], [2.2, 3, 3, 1.2]);
  doc.moveDown(0.4).font('Inter').fontSize(8.5).fillColor(grey);
  doc.text(`Target GSD ${fmt.gsdCm(r.spec.targetGsdCm)} ± ${fmt.percent(r.spec.gsdTolerance)}; altitude mode ${r.spec.altitudeMode}.`, page.margin);

  groundProof(doc, r, extras.coverageMap ?? null);
  asFlownSection(doc, r);

  heading(doc, 'Results overall');
  const o = r.overall;
  table(
    doc,
    [
      ['Stations', 'Meeting GSD', 'GSD min', 'GSD 5th pct', 'GSD median', 'GSD max', 'Fwd overlap min', 'Side overlap min', 'AGL min'],
      [String(o.stationCount), fmt.percent(o.shareMeetingGsd, 'min'), fmt.gsdCm(o.gsdCm.min, 'min'), fmt.gsdCm(o.gsdCm.p5), fmt.gsdCm(o.gsdCm.median), fmt.gsdCm(o.gsdCm.max, 'max'), fmt.percent(o.forwardOverlapMin, 'min'), fmt.percent(o.sideOverlapMin, 'min'), fmt.metres(o.aglMinM, 'min')],
    ],
    [1, 1.1, 1, 1, 1, 1, 1.1, 1.1, 1],
  );
  doc.moveDown(0.3).fontSize(8.5).fillColor(grey).text(`${o.lineCount} lines, ${o.photoCount} photos, flight time ${fmt.minutes(o.flightTimeS)}. Percentiles: ${r.percentileMethod}.`, page.margin);

  heading(doc, 'Results per line (flying order)');
  table(
    doc,
    [
      ['Line', 'Length', 'Meeting GSD', 'GSD min', 'GSD 5th pct', 'GSD median', 'GSD max', 'Fwd min', 'Side min', 'AGL min'],
      ...r.lines.map((l) => [
        String(l.number),
        fmt.metres(l.lengthM),
        fmt.percent(l.shareMeetingGsd, 'min'),
        fmt.gsdCm(l.gsdCm.min, 'min'),
        fmt.gsdCm(l.gsdCm.p5),
        fmt.gsdCm(l.gsdCm.median),
        fmt.gsdCm(l.gsdCm.max, 'max'),
        fmt.percent(l.forwardOverlapMin, 'min'),
        fmt.percent(l.sideOverlapMin, 'min'),
        fmt.metres(l.aglMinM, 'min'),
      ]),
    ],
    [0.6, 1.1, 1.1, 1, 1, 1, 1, 1, 1, 1],
  );
  const warned = r.lines.filter((l) => l.warnings.length > 0);
  if (warned.length) paragraphs(doc, warned.flatMap((l) => l.warnings.map((w) => (/^Line \d/.test(w) ? w : `Line ${l.number}: ${w}`))), '!');

  heading(doc, 'GSD along each line');
  doc.fontSize(8.5).fillColor(grey).text(`Shaded: the target band ${fmt.gsdCm(r.spec.gsdBandCm[0])} to ${fmt.gsdCm(r.spec.gsdBandCm[1])}. Red ticks: stations over unknown ground.`, page.margin);
  for (const l of r.lines) {
    const h = 130;
    // Everything the chart writes must fit above the bottom margin, or pdfkit starts a page in the middle of it.
    if (doc.y + h + 24 > pageBottom(doc)) doc.addPage();
    doc.font('Inter-Bold').fontSize(9).fillColor('black').text(`Line ${l.number} · ${fmt.metres(l.lengthM)} · heading ${fmt.degrees(l.headingDeg)}`, page.margin, doc.y + 4);
    const y = doc.y + 2;
    drawGsdChart(doc, l, r.spec.gsdBandCm, { x: page.margin, y, w: page.width, h });
    doc.y = y + h + 4;
    doc.x = page.margin;
  }

  heading(doc, 'Elevation grid used');
  const d = r.dem;
  table(
    doc,
    [
      ['Item', 'Value'],
      ['Site / file', `${d.siteName} / ${d.fileName}`],
      ['CRS', `${d.crs.name}${d.crs.epsg ? ` (EPSG:${d.crs.epsg})` : ''}`],
      ['Resolution', `${d.resolution[0]} x ${d.resolution[1]} ${d.resolutionUnit}`],
      ['Vertical datum', d.verticalDatum],
      ['Kind', d.surfaceKind === 'bare-earth' ? 'bare earth (ground only)' : 'surface model (tops of trees and buildings)'],
      ['Elevation range', `${fmt.metres(d.elevationRangeM[0])} to ${fmt.metres(d.elevationRangeM[1])}`],
    ],
    [1, 3],
  );

  heading(doc, 'Accuracy (ADVISORY)');
  const a = r.accuracy;
  doc.font('Inter-Bold').fontSize(9).fillColor('#8a4b00').text(`ADVISORY, not a guarantee (${a.source}).`, page.margin);
  doc.font('Inter').fillColor('#1b1e21');
  if (a.horizontalCm && a.verticalCm) {
    doc.text(`From the median GSD ${fmt.gsdCm(a.basisGsdCm)}: horizontal about ${fmt.gsdCm(a.horizontalCm[0])} to ${fmt.gsdCm(a.horizontalCm[1])}, vertical about ${fmt.gsdCm(a.verticalCm[0])} to ${fmt.gsdCm(a.verticalCm[1])}.`);
  }
  doc.text(a.ruleOfThumb).moveDown(0.2).text(a.deferral);

  heading(doc, 'Assumptions');
  paragraphs(doc, r.assumptions);
  if (r.warnings.length) {
    heading(doc, 'Warnings from the analysis');
    paragraphs(doc, r.warnings, '!');
  }
  heading(doc, 'Safety cautions');
  paragraphs(doc, r.cautions, '!');

  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottomMargin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0; // write the footer inside the margin without starting a new page
    doc.font('Inter').fontSize(7.5).fillColor(grey);
    doc.text(`Loftline compliance report · ${r.plan.name} v${r.version.number} · page ${i + 1} of ${range.count}`, page.margin, 812, { width: page.width, align: 'center', lineBreak: false });
    doc.page.margins.bottom = bottomMargin;
  }
  doc.end();
  return done;
}
