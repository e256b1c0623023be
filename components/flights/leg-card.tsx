/** One altitude leg on the leg sheet: the altitude above takeoff in large type, then datum height, ground range, heading, length, time. */
import { StyleSheet, View } from 'react-native';
import type { SheetLeg } from '../../contracts/flights';
import type { UnitSystem } from '../../contracts/projects';
import { formatDuration, formatLength } from '../projects/units';
import { FigureGrid } from '../reports/figure-grid';
import { formatHeading } from '../reports/report-figures';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';
import { formatAltitudePair, formatDatumPair, formatGsdRange, formatLatLon, formatRange, legKindLabel } from './leg-format';
import { altitudeFigureType } from './leg-type';

type LegCardProps = { leg: SheetLeg; lineNumber: number; units: UnitSystem; datumName: string };

/** testIDs: leg-L-N (the card), leg-L-N-altitude (the figure a pilot sets). */
export function LegCard({ leg, lineNumber, units, datumName }: LegCardProps) {
  const id = `leg-${lineNumber}-${leg.number}`;
  return (
    <View style={styles.card} testID={id} role="group" aria-label={`Line ${lineNumber}, leg ${leg.number}`}>
      <View style={styles.head}>
        <Text variant="title">Leg {leg.number}</Text>
        <Text variant="bodyStrong" tone="muted">
          {legKindLabel(leg)} · heading {formatHeading(leg.headingDeg)}
        </Text>
      </View>
      <View>
        <Text variant="label" tone="muted">
          Altitude above takeoff
        </Text>
        <Text style={altitudeFigureType} testID={`${id}-altitude`}>
          {formatAltitudePair(leg.altitudeAboveTakeoffM, units)}
        </Text>
        <Text variant="body" testID={`${id}-datum`}>
          {formatDatumPair(leg.altitudeAboveDatumM, units)} above {datumName}
        </Text>
      </View>
      <FigureGrid
        testID={`${id}-figures`}
        minCellPx={layout.maxFormWidthPx / 4}
        figures={[
          { key: 'agl', label: 'Height above ground', value: formatRange(leg.aglM, units) },
          { key: 'gsd', label: 'GSD', value: formatGsdRange(leg.gsdCm) },
          { key: 'length', label: 'Length', value: formatLength(leg.lengthM, units) },
          { key: 'time', label: 'Time', value: formatDuration(leg.timeS) },
          { key: 'start', label: `Start, ${formatLength(leg.start.distanceM, units)} along the line`, value: formatLatLon(leg.start) },
          { key: 'end', label: `End, ${formatLength(leg.end.distanceM, units)} along the line`, value: formatLatLon(leg.end) },
        ]}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
  },
  head: { flexDirection: 'row', flexWrap: 'wrap', justifyContent: 'space-between', alignItems: 'baseline', gap: space.sm },
});
