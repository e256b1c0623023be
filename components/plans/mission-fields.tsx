/** Targets, flight lines, altitudes and aircraft limits of the mission form, each field with its unit and its error. */
import { useController, useWatch, type Control, type UseFormSetValue } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { formatLength, formatSpeed } from '../projects/units';
import { space } from '../theme';
import { Banner, ChoiceGroup, Text } from '../ui';
import { FieldCell, FormSection } from './form-section';
import { NumberField } from './number-field';
import { fieldMessage, type PlanFormIn } from './plan-form-schema';

type Props = { control: Control<PlanFormIn>; setValue: UseFormSetValue<PlanFormIn>; readOnly: boolean; units: UnitSystem };

/** For imperial projects, the value in feet beside a metric field (the mission itself is always in SI units). */
function useFeetHint(control: Control<PlanFormIn>, name: 'mission.clearanceM' | 'mission.obstacleAllowanceM' | 'mission.maxAglM', units: UnitSystem) {
  const v = useWatch({ control, name }) as number | undefined;
  return units === 'imperial' && typeof v === 'number' && Number.isFinite(v) ? `= ${formatLength(v, 'imperial')}` : undefined;
}

export function TargetFields({ control, setValue, readOnly }: Props) {
  const heading = useController({ control, name: 'mission.headingDeg' });
  const advise = heading.field.value === 'advise';
  return (
    <FormSection title="Targets and flight lines" intro="What the client's specification asks for. Overlaps and tolerance are in percent." testID="targets-section">
      <FieldCell><NumberField control={control} name="mission.targetGsdCm" label="Target GSD" unit="cm" testID="plan-gsd" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.gsdTolerance" label="GSD tolerance, ±" unit="%" scale={100} hint="The band the GSD may vary in over the terrain." testID="plan-gsd-tolerance" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.forwardOverlap" label="Forward overlap" unit="%" scale={100} hint="Along a line; 70–80 % is usual for mapping." testID="plan-forward-overlap" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.sideOverlap" label="Side overlap" unit="%" scale={100} hint="Between lines; 60–70 % is usual for mapping." testID="plan-side-overlap" disabled={readOnly} /></FieldCell>
      <FieldCell wide>
        <View style={styles.stack}>
          <Text variant="label">Flight direction</Text>
          <ChoiceGroup
            label="Flight direction"
            choices={[{ value: 'advise', label: 'Advise me' }, { value: 'set', label: 'Set a heading' }]}
            value={advise ? 'advise' : 'set'}
            onChange={(v) => setValue('mission.headingDeg', v === 'advise' ? 'advise' : 0, { shouldValidate: true, shouldDirty: true })}
            disabled={readOnly}
            testID="plan-heading-mode"
          />
          <Text variant="caption" tone="muted">
            {advise ? 'The analysis tries headings 0–179° and picks the one with the least spread of height above ground (lines along the contours).' : 'Degrees clockwise from north for the first line; lines alternate from there.'}
          </Text>
          {heading.fieldState.error && advise ? <Text variant="caption" tone="danger">{fieldMessage(heading.fieldState.error.message)}</Text> : null}
        </View>
      </FieldCell>
      {!advise ? <FieldCell><NumberField control={control} name="mission.headingDeg" label="Heading" unit="°" testID="plan-heading" disabled={readOnly} /></FieldCell> : null}
    </FormSection>
  );
}

const modeChoices = [
  { value: 'hold', label: 'Hold' },
  { value: 'steps', label: 'Steps' },
  { value: 'follow', label: 'Follow' },
] as const;
const modeMeaning: Record<string, string> = {
  hold: 'Hold: one altitude per line. Simplest to fly; GSD varies most over hills.',
  steps: 'Steps: a few level legs per line, changing height between them.',
  follow: 'Follow: sloped legs that track the ground within the climb and descent limits.',
};

export function AltitudeFields({ control, readOnly, units }: Props) {
  const mode = useController({ control, name: 'mission.mode' });
  const clearanceHint = useFeetHint(control, 'mission.clearanceM', units);
  const allowanceHint = useFeetHint(control, 'mission.obstacleAllowanceM', units);
  const maxHint = useFeetHint(control, 'mission.maxAglM', units);
  return (
    <FormSection title="Altitudes" intro="Heights above the ground of the elevation grid, in metres." testID="altitude-section">
      <FieldCell wide>
        <View style={styles.stack}>
          <Text variant="label">Altitude mode</Text>
          <ChoiceGroup label="Altitude mode" choices={modeChoices} value={(mode.field.value as string) ?? 'follow'} onChange={mode.field.onChange} disabled={readOnly} testID="plan-mode" />
          <Text variant="caption" tone="muted">{modeMeaning[(mode.field.value as string) ?? 'follow']}</Text>
        </View>
      </FieldCell>
      <FieldCell><NumberField control={control} name="mission.clearanceM" label="Clearance above ground" unit="m" hint={clearanceHint ?? 'Never fly lower than this over the grid surface.'} testID="plan-clearance" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.obstacleAllowanceM" label="Obstacle allowance" unit="m" hint={allowanceHint ?? 'Added to the clearance for trees, masts and buildings the grid lacks.'} testID="plan-obstacles" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.maxAglM" label="Maximum height above ground" unit="m" hint={maxHint ?? 'Default 120 m.'} testID="plan-max-agl" disabled={readOnly} /></FieldCell>
      <FieldCell wide>
        <Banner tone="caution" message="Many places cap small unmanned aircraft at about 120 m (400 ft) above ground, but local rules govern: set the limit that applies where you fly." testID="max-agl-caution" />
      </FieldCell>
    </FormSection>
  );
}

export function AircraftFields({ control, readOnly, units }: Props) {
  const speed = useWatch({ control, name: 'mission.speedMps' }) as number | undefined;
  return (
    <FormSection title="Aircraft" intro="Limits of the aircraft as flown on this job." testID="aircraft-section">
      <FieldCell><NumberField control={control} name="mission.speedMps" label="Speed along lines" unit="m/s" hint={units === 'imperial' && typeof speed === 'number' ? `= ${formatSpeed(speed, 'imperial')}` : undefined} testID="plan-speed" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.climbMps" label="Climb rate" unit="m/s" testID="plan-climb" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.descentMps" label="Descent rate" unit="m/s" testID="plan-descent" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.enduranceMin" label="Endurance per battery" unit="min" testID="plan-endurance" disabled={readOnly} /></FieldCell>
    </FormSection>
  );
}

export function MoreFields({ control, readOnly }: Props) {
  return (
    <FormSection title="More settings" intro="Leg fitting, run-in and battery planning; the defaults suit small multirotors (common practice)." testID="more-section">
      <FieldCell><NumberField control={control} name="mission.minLegLengthM" label="Shortest leg" unit="m" testID="plan-min-leg" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.maxLegsPerLine" label="Most legs per line" testID="plan-max-legs" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.altitudeRoundingM" label="Round altitudes to" unit="m" testID="plan-rounding" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.runInM" label="Run-in and run-out" unit="m" testID="plan-run-in" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.batteryReserve" label="Battery reserve" unit="%" scale={100} testID="plan-reserve" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.turnTimeS" label="Time per turn" unit="s" testID="plan-turn-time" disabled={readOnly} /></FieldCell>
    </FormSection>
  );
}

const styles = StyleSheet.create({ stack: { gap: space.xs } });
