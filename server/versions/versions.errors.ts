/** Error codes about a plan version's state, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const versionErrors = defineErrors('versions', {
  /** The version's analysis is not finished; `message` says what cannot be done yet. */
  analysis_not_done: { status: 409, message: (message: string) => message },
  /** The version is not signed off; `message` says what needs the sign-off. */
  not_signed_off: { status: 409, message: (message: string) => message },
});
