/** The Profile's link to the development outbox: only for owners, and only while the server runs the fake SMTP server. */
import { can } from '../../contracts/roles';
import { useCurrentTeam } from '../team/current-team-context';
import { TextLink } from '../ui';
import { useOutbox } from './outbox.queries';

/** Renders nothing unless the outbox answers: a server with real SMTP has no outbox to show. */
export function OutboxLink() {
  const { team, role } = useCurrentTeam();
  const outbox = useOutbox(team?.id, can(role, 'outbox:read'));
  if (!outbox.isSuccess) return null;
  return <TextLink href="/outbox" label={`Development outbox (${outbox.data.length} ${outbox.data.length === 1 ? 'message' : 'messages'})`} testID="profile-outbox" />;
}
