/** The leg sheet's live coverage while the aircraft flies: photos recorded, share of the area meeting the spec, short patches already passed. */
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { BulletList } from '../reports/bullet-list';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Banner, Card, Heading, Loading, Text } from '../ui';
import { linkLineOf, liveViewOf, useLiveCoverage } from './use-live-coverage';

/** testIDs live-coverage, live-link, live-coverage-headline, live-coverage-items, live-coverage-patches, live-coverage-state. */
export function LiveCoverageCard(p: { teamId: string | undefined; versionId: string; signedOff: boolean; offline: boolean; units: UnitSystem }) {
  const { live: s, link } = useLiveCoverage(p.teamId, p.versionId, p.signedOff, p.offline);
  const v = s.kind === 'live' ? liveViewOf(s.doc, p.units) : null;
  return (
    <Card testID="live-coverage">
      <Heading level={2}>Live coverage (photos as flown)</Heading>
      {s.kind === 'unavailable' ? <Text tone="muted">{s.reason}</Text> : null}
      {link ? (
        <Text testID="live-link" tone={link.step === 'not-ready' ? 'danger' : undefined}>
          {linkLineOf(link)}
        </Text>
      ) : null}
      {s.kind === 'waiting' ? <Loading label="Connecting to the live coverage…" /> : null}
      {s.kind === 'live' && v ? (
        <View style={styles.body}>
          <Text testID="live-coverage-state" tone="muted">
            {s.connected ? 'Live' : 'Reconnecting'} · computed {formatDayTime(s.doc.computedAt)}
          </Text>
          <Text testID="live-coverage-headline">{v.headline}</Text>
          {v.refused ? <Banner tone="danger" title="Live coverage not computed" message={v.refused} /> : null}
          {v.items.length ? (
            <View testID="live-coverage-items">
              <BulletList items={v.items} />
            </View>
          ) : null}
          {v.patches.length ? (
            <Banner tone="caution" title="Passed but short of the spec: re-fly before landing" testID="live-coverage-patches">
              <BulletList items={v.patches} tone="caution" />
            </Banner>
          ) : null}
          <Text tone="muted">{s.doc.heights}</Text>
          {s.doc.state === 'ready' ? (
            <Banner tone="caution" title="While you fly">
              <BulletList items={s.doc.cautions} tone="caution" />
            </Banner>
          ) : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({ body: { gap: space.md } });
