/**
 * The same-day re-flight sheet: the stretches of the version's own lines that run through the re-flight areas,
 * with each stretch's legs at the version's heights (above takeoff in large type, then above the datum). On a
 * signed-off version these are parts of the reviewed plan, so the crew can fly them before leaving the site.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { AsFlownDoc } from '../../contracts/as-flown';
import type { UnitSystem } from '../../contracts/projects';
import { formatAltitudePair, formatDatumPair, formatLatLon } from '../flights/leg-format';
import { formatDuration, formatLength } from '../projects/units';
import { formatHeading } from '../reports/report-figures';
import { colors, radii, space } from '../theme';
import { Banner, Button, Heading, Text } from '../ui';

/** Stretches shown before "Show all": a pilot works down the list, and a long re-flight would bury the rest of the card. */
const FIRST_SHOWN = 4;

type Stretches = NonNullable<NonNullable<AsFlownDoc['reflight']>['stretches']>;

function photosWords(s: Stretches['items'][number]): string {
  if (s.firstPhoto === null) return 'no photo stations';
  return s.firstPhoto === s.lastPhoto ? `photo ${s.firstPhoto}` : `photos ${s.firstPhoto}–${s.lastPhoto}`;
}

/** testIDs: as-flown-stretches, as-flown-stretch-N (N from 1, in flying order of the areas), as-flown-stretch-N-altitude-K. */
export function ReflightStretches({ stretches: s, signedOff, units, datum }: { stretches: Stretches; signedOff: boolean | null; units: UnitSystem; datum: string }) {
  const [all, setAll] = useState(false);
  const shown = all ? s.items : s.items.slice(0, FIRST_SHOWN);
  if (s.items.length === 0) {
    return <Text testID="as-flown-stretches">No stretch of the version&apos;s lines runs through the re-flight areas: save the re-flight as a plan to fly it.</Text>;
  }
  return (
    <View style={styles.block} testID="as-flown-stretches">
      <Heading level={3}>Re-fly before you leave: stretches of {signedOff ? 'the signed-off' : 'this version\u2019s'} lines</Heading>
      <Text>
        {s.items.length} stretch{s.items.length === 1 ? '' : 'es'}, {formatLength(s.lengthM, units, 0)} on the lines, {s.photos} photo stations, about{' '}
        {formatDuration(s.timeS)} on the lines (add the transits). They take again every planned photo that saw the lost ground ({s.neededStations}{' '}
        stations); with the photos already taken, {s.coveredCells} of the {s.targetCells} lost cells worth re-flying then meet the whole spec. Fly each
        along its line, from and to the distances given from the line&apos;s start, at {signedOff ? 'the signed-off' : 'the version\u2019s'} heights
        below, triggering as on the full sheet.
      </Text>
      {signedOff === false ? (
        <Banner tone="danger" title="Not signed off">
          <Text>This version is not signed off: these stretches may be flown only once a surveyor has signed it off.</Text>
        </Banner>
      ) : null}
      {shown.map((st, n) => (
        <View key={`${st.line}-${st.firstPhoto}`} style={styles.stretch} testID={`as-flown-stretch-${n + 1}`} role="group" aria-label={`Re-flight stretch ${n + 1}: line ${st.line}`}>
          <Text variant="title">
            Line {st.line}: {formatLength(st.fromM, units, 0)} to {formatLength(st.toM, units, 0)} along
          </Text>
          <Text variant="bodyStrong" tone="muted">
            {formatLength(st.lengthM, units, 0)} · heading {formatHeading(st.headingDeg)} · {photosWords(st)} · {formatDuration(st.timeS)}
          </Text>
          <Text variant="label" tone="muted">
            Starts at {formatLatLon(st.start)}, ends at {formatLatLon(st.end)}
          </Text>
          {st.legs.map((g, k) => (
            <View key={k} style={styles.leg}>
              <Text variant="label" tone="muted" style={styles.legAt}>
                {formatLength(g.fromM, units, 0)}–{formatLength(g.toM, units, 0)}
              </Text>
              <View style={styles.legHeights}>
                <Text variant="bodyStrong" testID={`as-flown-stretch-${n + 1}-altitude-${k + 1}`}>
                  {formatAltitudePair({ start: g.altitudeStartAboveTakeoffM, end: g.altitudeEndAboveTakeoffM }, units)}
                </Text>
                <Text variant="label" tone="muted">
                  above takeoff · {formatDatumPair({ start: g.altitudeStartM, end: g.altitudeEndM }, units)} above {datum}
                </Text>
              </View>
            </View>
          ))}
        </View>
      ))}
      {s.items.length > shown.length ? (
        <Button variant="secondary" label={`Show all ${s.items.length} stretches`} onPress={() => setAll(true)} testID="as-flown-stretches-all" />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  block: { gap: space.sm },
  stretch: { gap: space.xs, padding: space.md, borderRadius: radii.md, borderWidth: 1, borderColor: colors.line },
  leg: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'baseline', gap: space.sm, paddingTop: space.xs },
  legAt: { minWidth: 96 },
  legHeights: { flexShrink: 1, gap: 2 },
});
