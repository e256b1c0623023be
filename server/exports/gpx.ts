/**
 * GPX 1.1 export (topografix.com/GPX/1/1): one route per line, a route point per waypoint. `ele` is metres above mean
 * sea level (EGM96) and `geoidheight` the EGM96 geoid height, as the GPX schema defines them.
 */
import { fmt } from '../reports/format';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';
import { xmlComment, xmlEscape as x } from './xml';

const num = (v: number, digits: number) => v.toFixed(digits);

export function toGpx(ctx: ExportContext): string {
  const lines = ctx.sheet.lines.map((line) => {
    const pts = ctx.waypoints.filter((w) => w.line === line.number).map((w) =>
      [
        `    <rtept lat="${num(w.lat, 8)}" lon="${num(w.lon, 8)}">`,
        `      <ele>${num(w.altitudeSeaLevelM, 3)}</ele>`,
        `      <geoidheight>${num(w.geoidHeightM, 3)}</geoidheight>`,
        `      <name>${x(`L${w.line} W${w.seq}`)}</name>`,
        `      <desc>${x(`${fmt.metres(w.altitudeAboveTakeoffM)} above takeoff; ${fmt.metres(w.altitudeAboveDatumM)} above ${w.verticalDatum}`)}</desc>`,
        '    </rtept>',
      ].join('\n'),
    );
    return [
      '  <rte>',
      `    <name>${x(`Line ${line.number}`)}</name>`,
      `    <desc>${x(`Heading ${fmt.degrees(line.headingDeg)}, ${fmt.metres(line.lengthM)}, ${line.legs.length} leg(s)`)}</desc>`,
      `    <number>${line.number}</number>`,
      ...pts,
      '  </rte>',
    ].join('\n');
  });
  const desc = [heightsNote(ctx, 'ele is metres above mean sea level (EGM96); geoidheight is the EGM96 geoid height.'), 'Cautions:', ...ctx.cautions].join(' ');
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    ...ctx.cautions.map((c) => xmlComment(`CAUTION: ${c}`)),
    '<gpx version="1.1" creator="Loftline" xmlns="http://www.topografix.com/GPX/1/1">',
    '  <metadata>',
    `    <name>${x(ctx.title)}</name>`,
    `    <desc>${x(desc)}</desc>`,
    `    <time>${ctx.generatedAt}</time>`,
    '  </metadata>',
    ...lines,
    '</gpx>',
    '',
  ].join('\n');
}
