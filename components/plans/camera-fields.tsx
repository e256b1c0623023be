/** The camera: one of the generic presets (terrain/camera.ts) or custom sensor, lens and image values. */
import { useState } from 'react';
import { useController, useWatch, type Control, type UseFormSetValue } from 'react-hook-form';
import { Pressable, StyleSheet, View, type PressableStateCallbackType } from 'react-native';
import { CAMERA_PRESETS, type Camera } from '../../terrain/camera';
import { colors, layout, radii, space } from '../theme';
import { ChoiceGroup, Text } from '../ui';
import { spaceActivates, webKeyProps } from '../ui/keys';
import { FieldCell, FormSection } from './form-section';
import { NumberField } from './number-field';
import { fieldMessage, type PlanFormIn } from './plan-form-schema';

type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };
const custom = 'custom';
const keys = ['sensorWidthMm', 'sensorHeightMm', 'focalLengthMm', 'imageWidthPx', 'imageHeightPx'] as const;

/** The preset whose values the camera has, or 'custom'. */
function presetIdOf(camera: Partial<Camera> | undefined): string {
  const p = CAMERA_PRESETS.find((c) => keys.every((k) => c.camera[k] === camera?.[k]));
  return p ? p.id : custom;
}

export function CameraFields({ control, setValue, readOnly }: { control: Control<PlanFormIn>; setValue: UseFormSetValue<PlanFormIn>; readOnly: boolean }) {
  const camera = useWatch({ control, name: 'mission.camera' }) as Partial<Camera> | undefined;
  const [customOpen, setCustomOpen] = useState(() => presetIdOf(camera) === custom);
  const chosen = customOpen ? custom : presetIdOf(camera);
  const side = useController({ control, name: 'mission.camera.alongTrackSide' });
  const cameraError = useController({ control, name: 'mission.camera' }).fieldState.error;
  const choose = (id: string) => {
    if (id === custom) return setCustomOpen(true);
    const p = CAMERA_PRESETS.find((c) => c.id === id);
    if (!p) return;
    setCustomOpen(false);
    setValue('mission.camera', { ...p.camera, alongTrackSide: camera?.alongTrackSide }, { shouldValidate: true, shouldDirty: true });
  };
  const options = [...CAMERA_PRESETS.map((p) => ({ id: p.id, label: p.label })), { id: custom, label: 'Custom values' }];
  return (
    <FormSection title="Camera" intro="Generic camera classes (sensor format, resolution, lens), or your own camera's values from its data sheet." testID="camera-section">
      <View role="radiogroup" aria-label="Camera" style={styles.list} testID="camera-preset">
        {options.map((o) => {
          const selected = o.id === chosen;
          return (
            <Pressable
              key={o.id}
              role="radio"
              aria-checked={selected}
              disabled={readOnly}
              onPress={() => choose(o.id)}
              {...webKeyProps({ onKeyDown: spaceActivates(() => !readOnly && choose(o.id)) })}
              testID={`camera-preset-${o.id}`}
              style={(s: WebPressState) => [styles.option, selected && styles.selected, (s.hovered || s.pressed) && !selected && styles.hovered, s.focused && styles.focused]}
            >
              <View style={[styles.dot, selected && styles.dotOn]} />
              <Text variant={selected ? 'bodyStrong' : 'body'}>{o.label}</Text>
            </Pressable>
          );
        })}
      </View>
      {chosen === custom ? (
        <>
          <FieldCell><NumberField control={control} name="mission.camera.sensorWidthMm" label="Sensor width" unit="mm" testID="camera-sensor-width" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.camera.sensorHeightMm" label="Sensor height" unit="mm" testID="camera-sensor-height" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.camera.focalLengthMm" label="Focal length" unit="mm" testID="camera-focal" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.camera.imageWidthPx" label="Image width" unit="px" testID="camera-image-width" disabled={readOnly} /></FieldCell>
          <FieldCell><NumberField control={control} name="mission.camera.imageHeightPx" label="Image height" unit="px" testID="camera-image-height" disabled={readOnly} /></FieldCell>
        </>
      ) : null}
      <FieldCell wide>
        <View style={styles.sideField}>
          <Text variant="label">Image side along the flight direction</Text>
          <ChoiceGroup
            label="Image side along the flight direction"
            choices={[{ value: 'height', label: 'Image height (usual)' }, { value: 'width', label: 'Image width' }]}
            value={(side.field.value as 'height' | 'width' | undefined) ?? 'height'}
            onChange={(v) => side.field.onChange(v === 'height' ? undefined : v)}
            disabled={readOnly}
            testID="camera-along-track"
          />
        </View>
      </FieldCell>
      {cameraError?.message ? (
        <Text variant="caption" tone="danger">
          {fieldMessage(cameraError.message)}
        </Text>
      ) : null}
    </FormSection>
  );
}

const styles = StyleSheet.create({
  list: { flexBasis: '100%', gap: space.xs },
  option: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.compactControlPx,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  selected: { borderColor: colors.primary, backgroundColor: colors.primarySoft },
  hovered: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
  dot: { width: space.lg, height: space.lg, borderRadius: radii.pill, borderWidth: layout.focusRingPx, borderColor: colors.lineStrong, backgroundColor: colors.surface },
  dotOn: { borderColor: colors.primary, borderWidth: space.xs },
  sideField: { gap: space.xs },
});
