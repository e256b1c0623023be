/** Error codes of projects, as data (status and message template); see defineErrors. */
import { defineErrors } from '../http/errors';

export const projectErrors = defineErrors('projects', {
  /** A change refused while the project is archived; `before` says what restoring it allows. */
  project_archived: { status: 409, message: (before: string) => `This project is archived; restore it before ${before}.` },
});
