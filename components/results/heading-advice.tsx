/** The heading advice: the recommended flight direction and the best alternatives, with why (spread of height above ground). */
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import type { PlanResult } from '../../terrain/plan';
import { compareHeadingOptions } from '../../terrain/heading';
import { formatLength } from '../projects/units';
import { layout, space } from '../theme';
import { Card, Heading, Text } from '../ui';

/** How many alternatives are listed beside the recommended heading. */
const shown = 5;

export function HeadingAdvice({ advice, units }: { advice: NonNullable<PlanResult['headingAdvice']>; units: UnitSystem }) {
  // the engine's own order (least spread; ties to the heading nearer 0°): the recommended heading is always the first row
  const best = [...advice.options].sort(compareHeadingOptions).slice(0, shown);
  return (
    <Card testID="heading-advice">
      <Heading level={2}>Heading advice: {advice.recommendedDeg}°</Heading>
      <Text variant="caption" tone="muted">
        Of the headings tried (0–179°), flying at {advice.recommendedDeg}° keeps the height above ground steadiest if each line were flown at one altitude: lines run along the contours.
      </Text>
      <View role="table" aria-label="Headings compared" style={styles.table}>
        <View role="row" style={styles.row}>
          {['Heading (true)', 'Lines', 'Flight distance', 'Height above ground spread (std. dev.)'].map((h) => (
            <Text key={h} role="columnheader" variant="label" tone="muted" style={styles.cell}>
              {h}
            </Text>
          ))}
        </View>
        {best.map((o) => (
          <View key={o.headingDeg} role="row" style={styles.row}>
            <Text role="rowheader" variant={o.headingDeg === advice.recommendedDeg ? 'bodyStrong' : 'body'} style={styles.cell}>
              {o.headingDeg}°{o.headingDeg === advice.recommendedDeg ? ' (recommended)' : ''}
            </Text>
            <Text role="cell" variant="caption" style={styles.cell}>{o.lineCount}</Text>
            <Text role="cell" variant="caption" style={styles.cell}>{formatLength(o.flightDistanceM, units)}</Text>
            <Text role="cell" variant="caption" style={styles.cell}>{formatLength(o.aglSpreadM, units, 1)}</Text>
          </View>
        ))}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  table: { gap: space.xxs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { minWidth: layout.inlineLabelPx, flexShrink: 1 },
});
