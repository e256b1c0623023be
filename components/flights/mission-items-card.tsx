/** The leg sheet's autopilot hand-off: MAVLink item count, altitude frame, trigger distance and speed per line, download. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { BulletList } from '../reports/bullet-list';
import { DownloadLink } from '../reports/download-link';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Banner, Button, Card, Heading, Loading, Text } from '../ui';
import { handoffLineText, itemRowText, useMissionItems } from './use-mission-items';

/** testIDs mission-items, mission-items-count, mission-items-line-N, mission-items-toggle, mission-items-list, mission-items-recorded, mission-items-download. */
export function MissionItemsCard(p: { teamId: string | undefined; versionId: string; signedOff: boolean; offline: boolean; units: UnitSystem }) {
  const h = useMissionItems(p.teamId, p.versionId, p.signedOff, p.offline);
  const [listOpen, setListOpen] = useState(false);
  return (
    <Card testID="mission-items">
      <Heading level={2}>Autopilot hand-off (MAVLink mission items)</Heading>
      {h.kind === 'unavailable' ? <Text tone="muted">{h.reason}</Text> : null}
      {h.kind === 'loading' ? <Loading label="Loading the mission items…" /> : null}
      {h.kind === 'error' ? <Banner tone="danger" title="Could not load the mission items" message={h.message} /> : null}
      {h.kind === 'ready' ? (
        <View style={styles.body}>
          <Text testID="mission-items-count">
            {h.itemCount} items. Altitudes in {h.frameName}: {h.reference}.
          </Text>
          <View style={styles.lines} role="list">
            {h.lines.map((l) => (
              <Text key={l.number} role="listitem" testID={`mission-items-line-${l.number}`}>
                {handoffLineText(l, p.units)}
              </Text>
            ))}
          </View>
          <Button label={listOpen ? 'Hide the items' : `Show the ${h.itemCount} items`} variant="quiet" size="compact" onPress={() => setListOpen(!listOpen)} style={styles.toggle} testID="mission-items-toggle" />
          {listOpen ? (
            <View style={styles.items} role="list" testID="mission-items-list">
              {h.items.map((i) => (
                <Text key={i.seq} variant="mono" role="listitem">
                  {itemRowText(i, p.units)}
                </Text>
              ))}
            </View>
          ) : null}
          <Text testID="mission-items-recorded">
            {h.recorded === null
              ? 'Photos recorded as flown: not known yet.'
              : h.recorded.count === 0
                ? 'No photos recorded as flown yet: run the link with --follow while the aircraft flies.'
                : `Photos recorded as flown: ${h.recorded.count}, the last at ${formatDayTime(h.recorded.lastAt)}.`}
          </Text>
          <Banner tone="caution" title="Before you upload">
            <BulletList items={h.cautions} tone="caution" />
          </Banner>
          <DownloadLink href={h.downloadHref} label="Download mission items (JSON)" detail="MAVLink MISSION_ITEM_INT fields and enum values; upload with npm run link" testID="mission-items-download" />
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({ body: { gap: space.md }, lines: { gap: space.xs }, items: { gap: 0 }, toggle: { alignSelf: 'flex-start' } });
