/** The site record from contracts/sites.ts, plus the words the upload form and the site page use about surface kinds. */
import type { SurfaceKind } from '../../contracts/sites';

export { duplicateSiteErrorSchema, siteListSchema, siteSchema, surfaceKinds, type Site, type SurfaceKind } from '../../contracts/sites';

/** A short label for each kind and what it means for clearance. */
export const surfaceKindInfo: Record<SurfaceKind, { label: string; hint: string }> = {
  'bare-earth': { label: 'Bare earth', hint: 'Ground only: trees, masts and buildings are not in the grid. Set an obstacle allowance.' },
  surface: { label: 'Surface model', hint: 'Includes vegetation and structures as the source saw them on the day it was made.' },
};


