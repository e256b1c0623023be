/** Error codes of as-flown checks, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const asFlownErrors = defineErrors('as-flown', {
  /** The version's grid is gone: its site record (`file` false) or its stored file (`file` true). */
  site_missing: {
    status: 409,
    message: (file: boolean) =>
      file ? 'The stored elevation grid file of this version is missing; upload it again to check photos against it.' : 'The elevation grid of this version is gone; the photos cannot be checked against it.',
  },
  check_timeout: { status: 503, message: (why: string) => `${why} Check fewer photos at a time (one flight per check), or try again when the server is less busy.` },
});
