/**
 * The client's spec for every ground cell and the attitude the aircraft really flies: what the ground proof checks
 * (maximum GSD, views per point, optional precision and views from all round) and the envelope it must hold under (roll, pitch, wind). Left
 * empty, an item takes the mission's default (the GSD band's coarse end, 2 views) or the preset's value.
 */
import { useController, useWatch, type Control, type UseFormSetValue } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { ENVELOPE_PRESETS } from '../../terrain/attitude-envelope';
import { space } from '../theme';
import { ChoiceGroup, Text } from '../ui';
import { FieldCell, FormSection } from './form-section';
import { NumberField } from './number-field';
import type { PlanFormIn } from './plan-form-schema';

type Props = { control: Control<PlanFormIn>; setValue: UseFormSetValue<PlanFormIn>; readOnly: boolean; units: UnitSystem };
type EnvelopeChoice = 'none' | 'multirotor' | 'fixed-wing';

const envelopeChoices = [
  { value: 'none', label: 'As planned' },
  { value: 'multirotor', label: 'Multirotor' },
  { value: 'fixed-wing', label: 'Fixed wing' },
] as const;

const layoutChoices = [
  { value: 'settings', label: 'From my overlaps' },
  { value: 'solver', label: 'Loftline meets the spec' },
] as const;

export function SpecFields({ control, setValue, readOnly }: Props) {
  const envelope = useController({ control, name: 'mission.envelope' });
  const layoutBy = useController({ control, name: 'mission.layoutBy' });
  const solver = layoutBy.field.value === 'solver';
  const preset = useWatch({ control, name: 'mission.envelope.preset' }) as EnvelopeChoice | undefined;
  const choice: EnvelopeChoice = envelope.field.value ? (preset ?? 'multirotor') : 'none';
  const defaults = choice === 'none' ? null : ENVELOPE_PRESETS[choice];
  return (
    <FormSection
      title="Spec for every ground cell"
      intro="What the ground proof checks in every cell of the area after each run. Left empty: the GSD band's coarse end and 2 views."
      testID="spec-section"
    >
      <FieldCell><NumberField control={control} name="mission.spec.maxGsdCm" label="Finest view no coarser than" unit="cm" hint="Every cell needs a view at or finer than this GSD." testID="plan-spec-gsd" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.spec.minViews" label="Views per point, at least" testID="plan-spec-views" hint="Photos that see each cell; 5 or more is usual for surveys (common practice)." disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.spec.maxSigmaVerticalM" label="Height precision, σ no more than" unit="m" hint="Optional; advisory, from the rays' geometry." testID="plan-spec-sigma" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.spec.maxDirectionGapDeg" label="Seen from all round: widest gap" unit="°" hint="Optional, for 3D: the widest gap between the directions of a cell's slanting views (90° is four sides, 180° two). When Loftline lays the lines out, it adds a second set across the first, with the camera tilted if the slant needs it." testID="plan-spec-direction-gap" disabled={readOnly} /></FieldCell>
      <FieldCell><NumberField control={control} name="mission.spec.obliqueDeg" label="A slanting view is at least" unit="° from vertical" hint="Empty: 30°." testID="plan-spec-oblique" disabled={readOnly} /></FieldCell>
      <FieldCell wide>
        <View style={styles.stack}>
          <Text variant="label">Attitude the proof must hold under</Text>
          <ChoiceGroup
            label="Attitude the proof must hold under"
            choices={envelopeChoices}
            value={choice}
            onChange={(v) => setValue('mission.envelope', v === 'none' ? null : { preset: v }, { shouldValidate: true, shouldDirty: true })}
            disabled={readOnly}
            testID="plan-envelope"
          />
          <Text variant="caption" tone="muted">
            {defaults
              ? `Every view must hold with the aircraft rolled up to ±${defaults.rollDeg}° and pitched up to ±${defaults.pitchDeg}°${defaults.crabs ? ', crabbing into the wind' : ''} unless set below.`
              : 'Views are counted at the planned attitude only: no allowance for roll, pitch or wind.'}
          </Text>
        </View>
      </FieldCell>
      {defaults ? (
        <>
          <FieldCell><NumberField control={control} name="mission.envelope.rollDeg" label="Roll, up to ±" unit="°" hint={`Empty: ${defaults.rollDeg}°.`} testID="plan-envelope-roll" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.envelope.pitchDeg" label="Pitch, up to ±" unit="°" hint={`Empty: ${defaults.pitchDeg}°.`} testID="plan-envelope-pitch" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.envelope.windMps" label="Wind" unit="m/s" hint="Empty: calm." testID="plan-envelope-wind" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.envelope.windFromDeg" label="Wind from" unit="°" hint="Degrees clockwise from north." testID="plan-envelope-wind-from" disabled={readOnly} /></FieldCell>
        </>
      ) : null}
      {/* after the envelope's own fields, so the solver's field does not read as one of them */}
      <FieldCell wide>
        <View style={styles.stack}>
          <Text variant="label">Lay the lines out</Text>
          <ChoiceGroup
            label="Lay the lines out"
            choices={layoutChoices}
            value={solver ? 'solver' : 'settings'}
            onChange={(v) => layoutBy.field.onChange(v)}
            disabled={readOnly}
            testID="plan-layout-by"
          />
          <Text variant="caption" tone="muted">
            {solver
              ? 'Loftline chooses the heading, the spacing of each line, photo spacing along it, altitude legs and a speed per leg so that every reachable cell meets this spec, in the least flight time it finds; your overlaps and heading are kept for comparison. Solving takes longer than an analysis.'
              : 'Lines follow your overlaps, heading and altitude mode; the ground proof then shows where they fall short of this spec.'}
          </Text>
        </View>
      </FieldCell>
      {solver ? (
        <FieldCell><NumberField control={control} name="mission.solve.beyondEdgeM" label="Lines may fly past the edge by" unit="m" hint="Empty: 0, lines stay over the area. Only where flying over the neighbouring ground is allowed: edge ground is then seen from outside too." testID="plan-solve-beyond" disabled={readOnly} /></FieldCell>
      ) : null}
    </FormSection>
  );
}

const styles = StyleSheet.create({ stack: { gap: space.xs } });
