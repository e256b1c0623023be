/** Who is calling: the signed-in user and session, and (after a permission guard) their role in the team. */
import type { Role } from '../../contracts/roles';

export interface SessionUser {
  id: string;
  name: string;
  email: string;
}

export interface RequestAuth {
  user: SessionUser;
  sessionId: string;
  /** Set by permission guards: the caller's role in `req.params.teamId`. */
  teamId?: string;
  role?: Role;
}
