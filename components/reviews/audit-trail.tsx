/** The plan's audit trail: who did what, when, to which version, with the comment they left. */
import { StyleSheet, View } from 'react-native';
import type { AuditEvent } from '../../contracts/reviews';
import { formatDayTime } from '../projects/format-date';
import { colors, layout, space } from '../theme';
import { Badge, Text } from '../ui';
import { auditDetail, auditTitle, newestFirst } from './review-state';

/** Newest first; entries of the version on screen carry a "this version" badge. */
export function AuditTrail({ events, currentVersionId }: { events: readonly AuditEvent[]; currentVersionId?: string }) {
  if (events.length === 0) {
    return (
      <Text tone="muted" testID="audit-empty">
        Nothing has happened to this plan's versions yet.
      </Text>
    );
  }
  const sorted = newestFirst(events);
  return (
    <View role="list" aria-label="Audit trail" testID="audit-trail">
      {sorted.map((e, i) => (
        <View key={e.id} role="listitem" testID={`audit-${e.action}`} style={[styles.item, i < sorted.length - 1 && styles.divider]}>
          <View style={styles.titleLine}>
            <Text variant="bodyStrong">{auditTitle(e.action)}</Text>
            {currentVersionId && e.versionId === currentVersionId ? <Badge label="This version" tone="primary" /> : null}
          </View>
          <Text variant="label" tone="muted">
            {auditDetail(e)} · {formatDayTime(e.at)}
          </Text>
          {e.comment ? (
            <View style={styles.comment}>
              <Text>{e.comment}</Text>
            </View>
          ) : null}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  item: { gap: space.xxs, paddingVertical: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  titleLine: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  comment: { borderLeftWidth: space.xxs, borderLeftColor: colors.lineStrong, paddingLeft: space.sm, marginTop: space.xxs },
});
