/** The public API of Loftline's terrain core: re-exports only (append new modules at the end). */
export * from './grid';
export * from './errors';
export { WGS84, crsFromProj4, createTransform } from './crs';
export { readDem, readDemHeader, openDem } from './dem';
export type { ByteRangeSource, InflateFn } from './dem';
export { describeGrid } from './metadata';
export type { GridMetadata } from './metadata';
export { hillshadePng } from './hillshade';
export { analysePlan, missionBboxWgs84 } from './plan';
export type { PlanResult } from './plan';
export { surveyDem } from './dem-survey';
