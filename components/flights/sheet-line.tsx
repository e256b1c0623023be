/** One flight line of the leg sheet: its number in flying order, its set (two sets across each other), heading, length, time, photos, camera tilt, warnings and legs. */
import { StyleSheet, View } from 'react-native';
import type { SheetLine as SheetLineData } from '../../contracts/flights';
import type { UnitSystem } from '../../contracts/projects';
import { formatCount, formatDuration, formatLength } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { formatHeading } from '../reports/report-figures';
import { space } from '../theme';
import { Banner, Card, Heading, Text } from '../ui';
import { LegCard } from './leg-card';
import { formatLatLon } from './leg-format';
import { lineAnchorId } from './line-index';

/** testID line-N. */
export function SheetLine({ line, units, datumName }: { line: SheetLineData; units: UnitSystem; datumName: string }) {
  return (
    // The line index scrolls to this anchor: the whole card comes to the top.
    <View nativeID={lineAnchorId(line.number)}>
      <Card testID={`line-${line.number}`}>
        {/* a lattice or slant plan: the set, as the version screen names it */}
        <Heading level={2}>Line {line.number}{line.set ? ` · set ${line.set}` : ''}</Heading>
        {line.set ? (
          <Text tone="muted" testID={`line-${line.number}-set`}>
            {line.set === 1 ? 'First set of lines.' : 'Second set of lines, across the first.'}
          </Text>
        ) : null}
        <Text variant="bodyStrong">
          Heading {formatHeading(line.headingDeg)} · {formatLength(line.lengthM, units)} · {formatDuration(line.timeS)} · {formatCount(line.photoCount)} photos
        </Text>
        <Text tone="muted">
          From {formatLatLon(line.start)} to {formatLatLon(line.end)}
        </Text>
        {line.cameraTiltDeg ? (
          <Text variant="bodyStrong" tone="caution" testID={`line-${line.number}-tilt`}>
            Camera tilted {line.cameraTiltDeg}° from straight down towards the nose (gimbal pitch {-(90 - line.cameraTiltDeg)}° from the horizon): set before the line, straight down after the last.
          </Text>
        ) : null}
        {line.warnings.length ? (
          <Banner tone="caution" title="On this line">
            <BulletList items={line.warnings} tone="caution" />
          </Banner>
        ) : null}
        <View style={styles.legs}>
          {line.legs.map((leg) => (
            <LegCard key={leg.number} leg={leg} lineNumber={line.number} units={units} datumName={datumName} />
          ))}
        </View>
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({ legs: { gap: space.md } });
