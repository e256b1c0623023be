/** The safety cautions live in contracts/cautions.ts (one wording for app, server, mail and command line). */
export { flightCautions, notSignedOffCaution, type CautionFacts } from '../../contracts/cautions';
