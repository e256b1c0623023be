/** Where a version's coverage files are stored: `teams/<team>/versions/<version id>/<file>` (orphan-sweep.ts knows the pattern). */
import type { CoverageMeasure } from '../../terrain/coverage-measures';

export const coverageKeys = {
  raster: (teamId: string, versionId: string) => `teams/${teamId}/versions/${versionId}/coverage.tif`,
  layer: (teamId: string, versionId: string, measure: CoverageMeasure) => `teams/${teamId}/versions/${versionId}/coverage-${measure}.png`,
  failing: (teamId: string, versionId: string) => `teams/${teamId}/versions/${versionId}/coverage-failing.png`,
  print: (teamId: string, versionId: string) => `teams/${teamId}/versions/${versionId}/coverage-print.png`,
};

/** `teams/<team>/versions/<version id>/<object>`: the keys of a version's stored files. */
export const versionObjectKey = /^teams\/[^/]+\/versions\/([0-9a-f-]{36})\/[^/]+$/;
