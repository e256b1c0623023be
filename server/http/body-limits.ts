/**
 * JSON body limits per route. Most requests are small (JSON_LIMIT, 1 MB by default); a photo log carries the
 * metadata of up to 20,000 photos (about 250 bytes each as JSON), so its POST gets room for that and no more.
 */
export const PHOTO_LOG_JSON_LIMIT = '6mb';

/** POST /teams/:teamId/flights/:versionId/as-flown-checks (server/as-flown/as-flown.routes.ts). */
export const asFlownChecksPath = /^\/teams\/[^/]+\/flights\/[^/]+\/as-flown-checks$/;
