/** Form to create a team; the creator becomes its owner. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { createTeamSchema, type CreateTeam, type TeamSummary } from '../../contracts/teams';
import { ApiError, errorMessage } from '../api/api-error';
import { useCreateTeam } from '../api/teams.queries';
import { layout, space } from '../theme';
import { Banner, Button, FormTextField } from '../ui';

/** Field problems from the server (422) land on the field; any other refusal shows above the form. */
export function CreateTeamForm({ onCreated }: { onCreated: (team: TeamSummary) => void }) {
  const create = useCreateTeam();
  const { control, handleSubmit, reset, setError, formState } = useForm<CreateTeam>({
    resolver: zodResolver(createTeamSchema),
    defaultValues: { name: '' },
  });

  const submit = handleSubmit(async (values) => {
    try {
      const team = await create.mutateAsync(values);
      reset({ name: '' });
      onCreated(team);
    } catch (e) {
      const nameProblem = e instanceof ApiError ? e.fields.find((f) => f.path === 'name') : undefined;
      if (nameProblem) setError('name', { message: nameProblem.message });
      else setError('root', { message: errorMessage(e) });
    }
  });

  return (
    <View style={styles.form}>
      {formState.errors.root?.message ? <Banner tone="danger" message={formState.errors.root.message} testID="create-team-failure" /> : null}
      <FormTextField
        control={control}
        name="name"
        label="Team name"
        hint="Usually the company or crew name. You become the team's owner."
        testID="create-team-name"
        onSubmitEditing={() => void submit()}
      />
      <Button label="Create team" onPress={() => void submit()} busy={formState.isSubmitting} testID="create-team-submit" style={styles.submit} />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg, maxWidth: layout.maxFormWidthPx }, submit: { alignSelf: 'flex-start' } });
