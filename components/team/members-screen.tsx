/** The team's members: everyone with member:read sees who is in the team; owners change roles and remove members. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { can, roleLabels, roles, roleSummaries } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { useMembers, useRemoveMember, useUpdateMemberRole } from '../api/members.queries';
import { TeamRulesCard } from './team-rules-card';
import { InvitationsCard } from '../invitations/invitations-card';
import { space } from '../theme';
import { Banner, Button, Card, EmptyState, Heading, Loading, Screen, Text } from '../ui';
import { useCurrentTeam } from './current-team-context';
import { MemberRow } from './member-row';
import { RequirePermission } from './require-permission';

/** The server guards every change (and keeps the last owner); refusals are shown in its own words. */
export function MembersScreen() {
  const { team, role, me } = useCurrentTeam();
  const mayRead = can(role, 'member:read');
  const manage = can(role, 'member:manage');
  const members = useMembers(team?.id, mayRead);
  const updateRole = useUpdateMemberRole(team?.id ?? '');
  const remove = useRemoveMember(team?.id ?? '');
  const [refusal, setRefusal] = useState<string | null>(null);
  const busy = updateRole.isPending || remove.isPending;

  return (
    <Screen title="Team" subtitle={team ? `People in ${team.name} and their roles` : undefined} testID="team-screen">
      <RequirePermission permission="member:read" what="The members list">
        {refusal ? <Banner tone="danger" title="That change was not made" message={refusal} testID="member-change-refused" /> : null}
        {members.isPending ? <Loading label="Loading members…" /> : null}
        {members.isError ? (
          <Banner tone="danger" title="Could not load the members" message={errorMessage(members.error)}>
            <Button label="Try again" variant="secondary" size="compact" onPress={() => void members.refetch()} style={styles.retry} />
          </Banner>
        ) : null}
        {members.data && members.data.length === 0 ? <EmptyState title="No members" message="This team has no members." /> : null}
        {members.data && members.data.length > 0 ? (
          <Card padded={false}>
            <View role="list" aria-label="Members" testID="members-list">
              {members.data.map((member, i) => (
                <MemberRow
                  key={member.id}
                  member={member}
                  isSelf={member.userId === me.user.id}
                  manage={manage}
                  busy={busy}
                  last={i === members.data.length - 1}
                  onRoleChange={(next) => {
                    setRefusal(null);
                    updateRole.mutate({ memberId: member.id, role: next }, { onError: (e) => setRefusal(errorMessage(e)) });
                  }}
                  onRemove={() => {
                    setRefusal(null);
                    remove.mutate({ memberId: member.id }, { onError: (e) => setRefusal(errorMessage(e)) });
                  }}
                />
              ))}
            </View>
          </Card>
        ) : null}
        {team && can(role, 'invitation:manage') ? <InvitationsCard teamId={team.id} /> : null}
        {team ? <TeamRulesCard teamId={team.id} mayChange={manage} /> : null}
        <Card>
          <Heading level={2}>What each role may do</Heading>
          {roles.map((r) => (
            <View key={r} style={styles.roleLine}>
              <Text variant="bodyStrong">{roleLabels[r]}</Text>
              <Text tone="muted">{roleSummaries[r]}</Text>
            </View>
          ))}
        </Card>
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({
  roleLine: { gap: space.xxs },
  retry: { alignSelf: 'flex-start' },
});
