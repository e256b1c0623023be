/** Error codes of plans, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const planErrors = defineErrors('plans', {
  plan_reviewed: { status: 409, message: () => 'This plan has versions in review or signed off; their record is kept, so the plan cannot be deleted.' },
});
