/** Error codes of coverage rasters, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const coverageErrors = defineErrors('coverage', {
  /** No ready coverage; `reason` says why (analysis not done, coverage still running or refused). */
  coverage_unavailable: { status: 409, message: (reason: string) => reason },
});
