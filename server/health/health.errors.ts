/** Error codes of the health check, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const healthErrors = defineErrors('health', {
  db_down: { status: 503, message: () => 'The database is not answering.' },
});
