/** Create or edit a project: name, client, notes and display units, checked with the API's own schema. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';
import { createProjectSchema, type UnitSystem } from '../../contracts/projects';
import { errorMessage } from '../api/api-error';
import { space } from '../theme';
import { Banner, Button, ChoiceGroup, Text, TextField } from '../ui';

type FormIn = z.input<typeof createProjectSchema>;
type FormOut = z.output<typeof createProjectSchema>;

const unitChoices: { value: UnitSystem; label: string }[] = [
  { value: 'metric', label: 'Metric (m, m/s)' },
  { value: 'imperial', label: 'Imperial (ft, ft/s)' },
];

type ProjectFormProps = {
  initial?: Partial<FormOut>;
  submitLabel: string;
  onSubmit: (values: FormOut) => Promise<unknown>;
  onCancel?: () => void;
  testID?: string;
};

/** The server's refusal (e.g. a duplicate name) is shown in its own words above the fields. */
export function ProjectForm({ initial, submitLabel, onSubmit, onCancel, testID = 'project-form' }: ProjectFormProps) {
  const [refusal, setRefusal] = useState<string | null>(null);
  const { control, handleSubmit, formState } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(createProjectSchema),
    defaultValues: { name: initial?.name ?? '', client: initial?.client ?? '', notes: initial?.notes ?? '', units: initial?.units ?? 'metric' },
  });
  const submit = handleSubmit(async (values) => {
    setRefusal(null);
    try {
      await onSubmit(values);
    } catch (e) {
      setRefusal(errorMessage(e));
    }
  });
  return (
    <View style={styles.form} testID={testID}>
      {refusal ? <Banner tone="danger" message={refusal} testID={`${testID}-refused`} /> : null}
      <Controller
        control={control}
        name="name"
        render={({ field, fieldState }) => (
          <TextField label="Project name" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} testID={`${testID}-name`} onSubmitEditing={() => void submit()} />
        )}
      />
      <Controller
        control={control}
        name="client"
        render={({ field, fieldState }) => (
          <TextField label="Client" hint="Who the survey is for (optional)." value={field.value ?? ''} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} testID={`${testID}-client`} />
        )}
      />
      <Controller
        control={control}
        name="notes"
        render={({ field, fieldState }) => (
          <TextField label="Notes" value={field.value ?? ''} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} multiline numberOfLines={3} testID={`${testID}-notes`} />
        )}
      />
      <Controller
        control={control}
        name="units"
        render={({ field }) => (
          <View style={styles.units}>
            <Text variant="label">Display units</Text>
            <ChoiceGroup label="Display units" choices={unitChoices} value={field.value ?? 'metric'} onChange={field.onChange} testID={`${testID}-units`} />
          </View>
        )}
      />
      <View style={styles.actions}>
        <Button label={submitLabel} busy={formState.isSubmitting} onPress={() => void submit()} testID={`${testID}-submit`} />
        {onCancel ? <Button label="Cancel" variant="quiet" onPress={onCancel} testID={`${testID}-cancel`} /> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  units: { gap: space.xs },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
