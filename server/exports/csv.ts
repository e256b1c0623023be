/** CSV export of the waypoints (papaparse), led by comment lines with the datum and the cautions. */
import Papa from 'papaparse';
import { waypointColumns } from '../../contracts/exports';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';

/** Comment lines start with "#" (papaparse reads them back with `comments: '#'`); a line break in a name cannot end one early. */
export function toCsv(ctx: ExportContext): string {
  const head = [
    `# ${ctx.title}${ctx.signedOff ? '' : ' (NOT SIGNED OFF)'}`,
    `# ${heightsNote(ctx, 'Heights in metres.')}`,
    ...ctx.cautions.map((c) => `# CAUTION: ${c}`),
  ];
  // escapeFormulae: a text cell starting with = + - @ (or tab/CR) gets a leading apostrophe so a spreadsheet shows it
  // as text instead of running it (common practice against CSV formula injection); numbers are left as they are.
  const body = Papa.unparse(
    { fields: [...waypointColumns], data: ctx.waypoints.map((w) => waypointColumns.map((k) => w[k])) },
    { newline: '\r\n', escapeFormulae: true },
  );
  return `${head.map((h) => h.replace(/[\r\n]+/g, ' ')).join('\r\n')}\r\n${body}\r\n`;
}
