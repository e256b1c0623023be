/** One signed-off flight in the list: plan, version, project and client, who signed it off, size and time. */
import { StyleSheet, View } from 'react-native';
import type { FlightSummary } from '../../contracts/flights';
import { formatDay } from '../projects/format-date';
import { formatCount, formatDuration } from '../projects/units';
import { colors, layout, space } from '../theme';
import { Badge, LinkPressable, Text } from '../ui';
import { reviewStateLabels } from '../../contracts/reviews';
import { reviewStateTones } from '../reviews/review-state';

/** The whole row is one link to the leg sheet (testID flight-<versionId>). */
export function FlightRow({ flight, last }: { flight: FlightSummary; last: boolean }) {
  return (
    <LinkPressable
      href={`/flights/${flight.versionId}`}
      testID={`flight-${flight.versionId}`}
      style={(s) => [styles.row, !last && styles.divider, (s.hovered || s.pressed) && styles.hover]}
    >
      <View style={styles.texts}>
        <View style={styles.titleLine}>
          <Text variant="title" tone="primary">
            {flight.planName} · version {flight.number}
          </Text>
          {/* Only signed-off versions are listed; the state is said in words all the same, as in every list. */}
          <Badge label={reviewStateLabels.signed_off} tone={reviewStateTones.signed_off} testID={`flight-state-${flight.versionId}`} />
        </View>
        <Text>
          {flight.projectName} for {flight.client}
        </Text>
        <Text tone="muted">
          {formatCount(flight.lineCount)} lines · {formatCount(flight.photoCount)} photos · {formatDuration(flight.flightTimeS)}
        </Text>
        <Text variant="label" tone="muted">
          Signed off by {flight.signedOffBy ?? '–'} on {formatDay(flight.signedOffAt)}
        </Text>
      </View>
    </LinkPressable>
  );
}

const styles = StyleSheet.create({
  row: { padding: space.lg, minHeight: layout.minTouchPx },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  hover: { backgroundColor: colors.surfaceSunken },
  texts: { gap: space.xxs },
  titleLine: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
});
