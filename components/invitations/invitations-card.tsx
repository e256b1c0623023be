/** The owner's part of the Team screen: invite someone, and the team's invitations with revoke. */
import { useState } from 'react';
import { View } from 'react-native';
import { errorMessage } from '../api/api-error';
import { Banner, Card, Heading, Loading, Text } from '../ui';
import { InvitationRow } from './invitation-row';
import { orderInvitations } from './invitation-status';
import { useInvitations, useRevokeInvitation } from './invitations.queries';
import { InviteForm } from './invite-form';

/** Rendered only for roles with invitation:manage (owners); the server refuses everyone else anyway. */
export function InvitationsCard({ teamId }: { teamId: string }) {
  const list = useInvitations(teamId);
  const revoke = useRevokeInvitation(teamId);
  const [refusal, setRefusal] = useState<string | null>(null);
  const ordered = list.data ? orderInvitations(list.data) : [];
  return (
    <>
      <Card testID="invite-card">
        <Heading level={2}>Invite someone</Heading>
        <InviteForm teamId={teamId} />
      </Card>
      <Card testID="invitations-card">
        <Heading level={2}>Invitations</Heading>
        {refusal ? <Banner tone="danger" title="Not revoked" message={refusal} /> : null}
        {list.isPending ? <Loading label="Loading the invitations…" /> : null}
        {list.isError ? <Banner tone="danger" message={errorMessage(list.error)} /> : null}
        {list.data && ordered.length === 0 ? <Text tone="muted">No invitations yet.</Text> : null}
        {ordered.length > 0 ? (
          <View role="list" aria-label="Invitations" testID="invitations-list">
            {ordered.map((inv, i) => (
              <InvitationRow
                key={inv.id}
                invitation={inv}
                last={i === ordered.length - 1}
                busy={revoke.isPending && revoke.variables?.invitationId === inv.id}
                onRevoke={() => {
                  setRefusal(null);
                  revoke.mutate({ invitationId: inv.id }, { onError: (e) => setRefusal(errorMessage(e)) });
                }}
              />
            ))}
          </View>
        ) : null}
      </Card>
    </>
  );
}
