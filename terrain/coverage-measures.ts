/** The measures of a coverage raster that the map can colour (shared by the layer images and the API's shapes). */
export const coverageMeasures = ['gsd', 'views', 'sigma'] as const;
export type CoverageMeasure = (typeof coverageMeasures)[number];
