/**
 * Error codes answered on /api/auth, as data (status and message template); see defineErrors. They follow the
 * sign-in library's own upper-case codes and body ({ code, message }), as the rest of /api/auth does.
 */
import { defineErrors } from '../http/errors';

export const authErrors = defineErrors('auth', {
  NOT_FOUND: { status: 404, message: () => 'Teams, members and invitations are managed through /api/teams.' },
  TOO_MANY_REQUESTS: { status: 429, message: (waitS: number) => `Too many failed sign-ins for this account; try again in ${waitS} s.` },
});
