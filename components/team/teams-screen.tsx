/** The team switcher: the user's teams with their role in each, and a form to create another. */
import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { roleLabels } from '../../contracts/roles';
import { homeFor } from '../navigation/nav-items';
import { colors, layout, space } from '../theme';
import { Badge, Banner, Button, Card, Heading, Screen, Text } from '../ui';
import { CreateTeamForm } from './create-team-form';
import { useCurrentTeam } from './current-team-context';

/** Picking a team makes it current on this device and goes to that role's home screen. */
export function TeamsScreen() {
  const router = useRouter();
  const { me, team: current, selectTeam } = useCurrentTeam();
  const hasTeams = me.teams.length > 0;

  return (
    <Screen title="Teams" subtitle="Switch between the teams you belong to, or start a new one." testID="teams-screen">
      {hasTeams ? null : (
        <Banner
          tone="info"
          title="You are not in a team yet"
          message="Create a team for your company or crew, or ask a team owner to add you."
          testID="no-team"
        />
      )}
      {hasTeams ? (
        <Card padded={false}>
          <View role="list" aria-label="Your teams" testID="teams-list">
            {me.teams.map((t, i) => {
              const isCurrent = t.id === current?.id;
              return (
                <View key={t.id} role="listitem" testID={`team-${t.slug}`} style={[styles.row, i < me.teams.length - 1 && styles.divider]}>
                  <View style={styles.who}>
                    <Text variant="bodyStrong">{t.name}</Text>
                    <View style={styles.badges}>
                      <Badge label={roleLabels[t.role]} tone="primary" />
                      {isCurrent ? <Badge label="Current" tone="success" /> : null}
                    </View>
                  </View>
                  <Button
                    label={isCurrent ? 'Open' : 'Switch'}
                    variant={isCurrent ? 'quiet' : 'secondary'}
                    size="compact"
                    accessibilityLabel={isCurrent ? `Open ${t.name}` : `Switch to ${t.name}`}
                    testID={`team-pick-${t.slug}`}
                    onPress={() => {
                      selectTeam(t.id);
                      router.replace(homeFor(t.role));
                    }}
                  />
                </View>
              );
            })}
          </View>
        </Card>
      ) : null}
      <Card>
        <Heading level={2}>Create a team</Heading>
        <CreateTeamForm
          onCreated={(team) => {
            selectTeam(team.id);
            router.replace(homeFor(team.role));
          }}
        />
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.md, padding: space.lg, minHeight: layout.minTouchPx },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  who: { flexShrink: 1, gap: space.xs },
  badges: { flexDirection: 'row', gap: space.xs, flexWrap: 'wrap' },
});
