/** The profile: who is signed in, the current team and role, and signing out. */
import { useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { roleLabels, roleSummaries } from '../../contracts/roles';
import { authClient, authFailureFrom } from '../auth/auth-client';
import { OutboxLink } from '../outbox/outbox-link';
import { rememberTeam } from '../team/team-storage';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, space } from '../theme';
import { Badge, Banner, Button, Card, Heading, Screen, Text, TextLink } from '../ui';
import { forgetDeviceQueries } from '../api/device-queries';

/** Sign-out also forgets the remembered team and every cached answer, so the next user on this device starts clean. */
export function ProfileScreen() {
  const { me, team, role } = useCurrentTeam();
  const queryClient = useQueryClient();
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);

  const signOut = async () => {
    setBusy(true);
    setFailure(null);
    const { error } = await authClient.signOut();
    const refused = authFailureFrom(error);
    if (refused) {
      setBusy(false);
      setFailure(refused.message);
      return;
    }
    rememberTeam(null);
    forgetDeviceQueries(); // the next person on this device must not open as this user offline
    queryClient.clear();
    router.replace('/sign-in');
  };

  return (
    <Screen title="Profile" testID="profile-screen">
      {failure ? <Banner tone="danger" title="Sign-out failed" message={failure} /> : null}
      <Card>
        <Field label="Name" value={me.user.name} testID="profile-name" />
        <Field label="E-mail" value={me.user.email} testID="profile-email" last />
      </Card>
      <Card>
        <Heading level={2}>Current team</Heading>
        {team && role ? (
          <View style={styles.team}>
            <View style={styles.teamLine}>
              <Text variant="bodyStrong" testID="profile-team">
                {team.name}
              </Text>
              <Badge label={roleLabels[role]} tone="primary" testID="profile-role" />
            </View>
            <Text tone="muted">{roleSummaries[role]}</Text>
          </View>
        ) : (
          <Text tone="muted">No team yet.</Text>
        )}
        <TextLink href="/teams" label={me.teams.length > 1 ? 'Switch team' : 'Create another team'} testID="profile-teams" />
        <OutboxLink />
      </Card>
      <Button label="Sign out" variant="secondary" busy={busy} onPress={() => void signOut()} testID="sign-out" style={styles.signOut} />
    </Screen>
  );
}

function Field({ label, value, testID, last = false }: { label: string; value: string; testID: string; last?: boolean }) {
  return (
    <View style={[styles.field, !last && styles.divider]}>
      <Text variant="caption" tone="muted">
        {label}
      </Text>
      <Text testID={testID}>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xxs },
  divider: { paddingBottom: space.md, borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  team: { gap: space.xs },
  teamLine: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  signOut: { alignSelf: 'flex-start' },
});
