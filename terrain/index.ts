/** The public API of Loftline's terrain core: re-exports only (append new modules at the end). */
export * from './grid';
export * from './errors';
export { WGS84, WEB_MERCATOR, utmCrs, utmCrsFor, crsFromEpsg, crsFromString, crsFromProj4, crsFromGeoKeys, createTransform, unitOfProj4 } from './crs';
export type { Transform } from './crs';
export { readDem, readDemHeader, openDem, windowToPixels } from './dem';
export type { DemHeader, DemSource, DemWindow, ReadDemOptions, InflateFn } from './dem';
export { metresPerUnit } from './dem-header';
export { sampleAt, samplePoints, sampleAlongLine, sampleGridCoords, densifyLine } from './sample';
export type { SampleMethod, SampleOptions } from './sample';
export { describeGrid, pixelBounds, pixelBoundsWgs84 } from './metadata';
export type { GridMetadata } from './metadata';
export { hillshadePng } from './hillshade';
export type { Hillshade, HillshadeOptions } from './hillshade';
export { geoidUndulationM, ellipsoidToEgm96, egm96ToEllipsoid } from './heights';
