/** Error codes of teams, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const teamErrors = defineErrors('teams', {
  last_owner: { status: 409, message: () => 'A team needs at least one owner: make another member an owner first.' },
});
