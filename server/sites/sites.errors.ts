/** Error codes of sites (elevation grids), as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

const tooSlow = (limitMs: number) =>
  `Reading the grid took longer than this server allows (${Math.round(limitMs / 1000)} s, TERRAIN_TASK_SECONDS) and was stopped; nothing was kept. Crop or resample the DEM (gdal_translate -projwin / -tr) and upload it again.`;

export const siteErrors = defineErrors('sites', {
  /** `plans`: how many plans use the grid; null when analysed versions fix how it is described. */
  site_in_use: {
    status: 409,
    message: (plans: number | null) =>
      plans === null
        ? 'Plan versions were analysed over this grid as it is described now; upload the file again as a new site to describe it differently.'
        : `This elevation grid is used by ${plans === 1 ? 'a plan' : `${plans} plans`} (or their analysed versions); delete those plans first.`,
  },
  duplicate_site: { status: 409, message: () => 'This project already has this elevation grid (same file checksum); use the existing site.' },
  upload_incomplete: { status: 400, message: () => 'The upload ended before the whole form arrived; nothing was kept. Try again.' },
  'too-slow': { status: 422, message: tooSlow, fields: (limitMs: number) => [{ path: 'file', message: tooSlow(limitMs) }] },
  'unreadable-grid': {
    status: 422,
    message: (where: string) => `The grid's description has a value Loftline cannot use (${where}); check the file's georeference and heights in your GIS and export it again.`,
    fields: (where: string) => [{ path: 'file', message: `Unusable value at ${where}.` }],
  },
});
