/** Plans, versions and their analysis states as contracts/plans.ts defines them (one import point for the client). */
export { analysisStateLabels, planListSchema, planSchema, planVersionOverviewSchema, versionListSchema, versionStatusSchema, versionSummarySchema, type AnalysisState, type Plan, type VersionStatus, type VersionSummary } from '../../contracts/plans';
export { resultLineSchema } from '../../contracts/result-parts';
