/** Live flat-ground figures for the form's current values: the height for the target GSD, footprint, spacing. */
import { useWatch, type Control } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { formatLength } from '../projects/units';
import { space } from '../theme';
import { Banner, Card, Heading, Text } from '../ui';
import { deriveValues } from './derived-values';
import type { PlanFormIn } from './plan-form-schema';

function Figure({ label, value, testID }: { label: string; value: string; testID?: string }) {
  return (
    <View style={styles.figure}>
      <Text variant="caption" tone="muted">{label}</Text>
      <Text variant="bodyStrong" testID={testID}>{value}</Text>
    </View>
  );
}

export function DerivedPanel({ control, units }: { control: Control<PlanFormIn>; units: UnitSystem }) {
  const m = useWatch({ control, name: 'mission' }) as Partial<Record<string, unknown>> | undefined;
  const d = deriveValues({
    camera: m?.camera as never,
    targetGsdCm: m?.targetGsdCm as number | undefined,
    gsdTolerance: m?.gsdTolerance as number | undefined,
    forwardOverlap: m?.forwardOverlap as number | undefined,
    sideOverlap: m?.sideOverlap as number | undefined,
    maxAglM: m?.maxAglM as number | undefined,
  });
  const L = (v: number) => formatLength(v, units, 1);
  return (
    <Card testID="derived-values">
      <Heading level={2}>On flat ground</Heading>
      <Text variant="caption" tone="muted">
        Textbook figures (GSD = height × pixel pitch ÷ focal length). The analysis then checks every photo over the real terrain.
      </Text>
      {d ? (
        <View style={styles.grid}>
          <Figure label="Height above ground for the target GSD" value={L(d.heightM)} testID="derived-height" />
          <Figure label="Height band above ground for the tolerance" value={`${L(d.bandLowM)} – ${L(d.bandHighM)}`} />
          <Figure label="Footprint across × along" value={`${L(d.footprintAcrossM)} × ${L(d.footprintAlongM)}`} testID="derived-footprint" />
          <Figure label="Line spacing" value={L(d.lineSpacingM)} testID="derived-spacing" />
          <Figure label="Photo every" value={L(d.triggerDistanceM)} testID="derived-trigger" />
        </View>
      ) : (
        <Text tone="muted">Complete the camera, target GSD and overlaps to see the figures.</Text>
      )}
      {d?.aboveMaxAgl ? (
        <Banner tone="caution" message={`The target GSD needs ${L(d.heightM)} above ground, more than the maximum height set: the plan will fly lower and the GSD will be finer than the target.`} testID="derived-above-max" />
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  figure: { flexBasis: 160, flexGrow: 1, gap: space.xxs },
});
