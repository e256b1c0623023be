/** Route /work: the home of owners, planners and surveyors, listing the versions waiting for them, with their states. */
import { StyleSheet, View } from 'react-native';
import { roleLabels } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { FlightCautions } from '../safety/flight-cautions';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, space } from '../theme';
import { Badge, Banner, Button, Card, Heading, LinkPressable, List, Loading, Screen, Text } from '../ui';
import { useWorkScreen } from './use-work-screen';
import type { WorkRow, WorkSectionView } from './work-rows';

export function WorkScreen() {
  const { team, role } = useCurrentTeam();
  const w = useWorkScreen(team?.id);
  return (
    <Screen title="Work" subtitle={team && role ? `What waits for you as ${roleLabels[role].toLowerCase()} in ${team.name}` : undefined} testID="work-screen">
      {w.query.isPending ? <Loading label="Loading your work…" /> : null}
      {w.query.isError ? (
        <Banner tone="danger" title="Could not load your work" message={errorMessage(w.query.error)} testID="work-failure">
          <Button label="Try again" variant="secondary" size="compact" onPress={() => void w.query.refetch()} />
        </Banner>
      ) : null}
      {w.total === 0 ? <Text tone="muted" testID="work-nothing">Nothing waits for you right now. Projects and plans are under Projects.</Text> : null}
      {w.sections.map((s) => (
        <WorkSectionCard key={s.kind} section={s} />
      ))}
      {w.hasFlights ? <FlightCautions /> : null}
    </Screen>
  );
}

function WorkSectionCard({ section }: { section: WorkSectionView }) {
  return (
    <Card testID={`work-${section.kind}`}>
      <Heading level={2}>{`${section.title} (${section.rows.length})`}</Heading>
      <Text tone="muted">{section.rows.length ? section.note : section.empty}</Text>
      <List label={section.title}>
        {section.rows.map((r, i) => (
          <WorkRowLink key={r.key} row={r} kind={section.kind} last={i === section.rows.length - 1} />
        ))}
      </List>
    </Card>
  );
}

function WorkRowLink({ row, kind, last }: { row: WorkRow; kind: string; last: boolean }) {
  return (
    <LinkPressable
      href={row.href}
      testID={`work-${kind}-${row.key}`}
      style={(s) => [styles.row, !last && styles.divider, (s.hovered || s.pressed) && styles.hover, s.focused && styles.focused]}
    >
      <View style={styles.titleLine}>
        <Text variant="bodyStrong" tone="primary">{row.title}</Text>
        <Badge label={row.state.label} tone={row.state.tone} testID={`work-state-${row.key}`} />
      </View>
      <Text>{row.project}</Text>
      <Text variant="caption" tone="muted">{row.history}</Text>
      {row.comment ? <Text variant="caption" testID={`work-comment-${row.key}`}>{`“${row.comment}”`}</Text> : null}
    </LinkPressable>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xxs, paddingVertical: space.sm, minHeight: layout.minTouchPx },
  titleLine: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  hover: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
});
