/** Error codes of reviews and flown confirmations, as data (status and message template); see defineErrors. */
import { defineErrors, type FieldProblem } from '../http/errors';

export const reviewErrors = defineErrors('reviews', {
  /** Signing off or confirming despite unmet items needs a reason for each; `fields` names each missing one. */
  reasons_required: { status: 422, message: (message: string, _fields: FieldProblem[]) => message, fields: (_message: string, fields: FieldProblem[]) => fields },
  not_independent: { status: 409, message: (message: string) => message },
  invalid_transition: { status: 409, message: (message: string) => message },
  already_confirmed: { status: 409, message: (message: string) => message },
  as_flown_required: { status: 409, message: (message: string) => message },
});
