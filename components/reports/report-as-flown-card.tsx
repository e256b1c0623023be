/** The report's as-flown section: the latest check of the photos, the spec as flown next to as planned, what to re-fly. */
import { StyleSheet, View } from 'react-native';
import type { ReportAsFlown } from '../../contracts/reports';
import { areaWords, shareWords } from '../../contracts/coverage-words';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Card, Heading, List, Text } from '../ui';
import { AsFlownMap } from '../as-flown/as-flown-map';

export function ReportAsFlownCard({ asFlown: a }: { asFlown: ReportAsFlown | null }) {
  return (
    <Card testID="report-as-flown">
      <Heading level={2}>As flown</Heading>
      {a === null ? (
        <Text tone="muted" testID="report-as-flown-none">No photos of this version have been checked as flown yet; the figures above are the plan&apos;s.</Text>
      ) : (
        <>
          <Text variant="caption" tone="muted">
            Latest of {a.checkCount} check{a.checkCount === 1 ? '' : 's'}: {a.label}, {a.photoCount} photos, checked by {a.checkedBy ?? 'a former member'} on {formatDayTime(a.checkedAt)}.
          </Text>
          <Text variant="bodyStrong" testID="report-as-flown-share">
            Whole spec met on {shareWords(a.shareAllFlown)} of the area as flown ({shareWords(a.shareAllPlanned)} as planned).
          </Text>
          <List label="Share of the area meeting each item, as flown and as planned" style={styles.list} testID="report-as-flown-items">
            {a.items.map((it) => (
              <View key={it.item}>
                <Text variant="bodyStrong">{it.title}</Text>
                <Text tone={it.flown < it.planned ? 'caution' : undefined}>
                  {shareWords(it.flown)} as flown · {shareWords(it.planned)} as planned
                </Text>
              </View>
            ))}
          </List>
          <Text>
            {a.matched} photos on planned stations, {a.missedTriggers} missed trigger{a.missedTriggers === 1 ? '' : 's'}
            {a.missedRuns.length ? ` (${a.missedRuns.slice(0, 6).join('; ')}${a.missedRuns.length > 6 ? '; …' : ''})` : ''}, {a.extraPhotos} extra; ground lost against the plan:{' '}
            {areaWords(a.lostAreaM2)}.
          </Text>
          {a.offTrack.length ? <Text tone="caution">Flown off track: {a.offTrack.join('; ')}.</Text> : null}
          {a.map ? <AsFlownMap map={a.map} /> : null}
          <Text testID="report-as-flown-reflight">{a.reflight}</Text>
          <Text variant="caption" tone="muted">{a.heights}</Text>
        </>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({ list: { gap: space.sm } });
