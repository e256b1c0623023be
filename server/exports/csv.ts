/**
 * CSV export of the waypoints (papaparse): a plain table, one header row and one row per waypoint, so standard
 * readers (GDAL/OGR, spreadsheets, papaparse) take the column names from the first line. What a file of numbers
 * must not lose goes in columns on every row, so no filter or sort can drop it: the plan, whether it is signed off,
 * what the heights are measured from, and the cautions.
 */
import Papa from 'papaparse';
import { waypointColumns } from '../../contracts/exports';
import type { ExportContext } from './export-context';
import { heightsNote } from './export-context';

/** The CSV's columns: the waypoint fields, then the context columns repeated on every row. */
export const csvColumns = [...waypointColumns, 'plan', 'status', 'heightsReference', 'cautions'] as const;

export function toCsv(ctx: ExportContext): string {
  const context = {
    plan: ctx.title,
    status: ctx.signedOff ? 'signed off' : 'NOT SIGNED OFF: not for flight',
    heightsReference: heightsNote(ctx, 'Heights in metres.'),
    cautions: ctx.cautions.join(' | '),
  };
  // escapeFormulae: a text cell starting with = + - @ (or tab/CR) gets a leading apostrophe so a spreadsheet shows it
  // as text instead of running it (common practice against CSV formula injection); numbers are left as they are.
  return `${Papa.unparse(
    { fields: [...csvColumns], data: ctx.waypoints.map((w) => csvColumns.map((k) => (k in context ? context[k as keyof typeof context] : w[k as keyof typeof w]))) },
    { newline: '\r\n', escapeFormulae: true },
  )}\r\n`;
}
