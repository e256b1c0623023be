/** The owner's invite form: an e-mail address and a role; the server mails the link and answers with it. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { createInvitationSchema, type CreateInvitation } from '../../contracts/invitations';
import { roleLabels, roles, roleSummaries } from '../../contracts/roles';
import { ApiError, errorMessage } from '../api/api-error';
import { space } from '../theme';
import { Banner, Button, ChoiceGroup, Text, FormTextField } from '../ui';
import { useCreateInvitation } from './invitations.queries';

const roleChoices = roles.map((r) => ({ value: r, label: roleLabels[r] }));

type Sent = { email: string; role: string; link: string | null; mailed: boolean; reason?: string };

/** Field problems from the server land on their field; any other refusal (already a member, already invited) above the form. */
export function InviteForm({ teamId }: { teamId: string }) {
  const create = useCreateInvitation(teamId);
  const [sent, setSent] = useState<Sent | null>(null);
  const { control, handleSubmit, reset, setError, watch, formState } = useForm<CreateInvitation>({
    resolver: zodResolver(createInvitationSchema),
    defaultValues: { email: '', role: 'pilot' },
  });
  const role = watch('role');

  const submit = handleSubmit(async (values) => {
    setSent(null);
    try {
      const inv = await create.mutateAsync(values);
      setSent({ email: inv.email, role: roleLabels[inv.role], link: inv.link, mailed: inv.notification.status === 'queued', reason: inv.notification.reason });
      reset({ email: '', role: values.role });
    } catch (e) {
      const fieldProblem = e instanceof ApiError ? e.fields.find((f) => f.path === 'email' || f.path === 'role') : undefined;
      if (fieldProblem) setError(fieldProblem.path as 'email' | 'role', { message: fieldProblem.message });
      else setError('root', { message: errorMessage(e) });
    }
  });

  return (
    <View style={styles.form} testID="invite-form">
      {formState.errors.root?.message ? <Banner tone="danger" title="Not invited" message={formState.errors.root.message} testID="invite-refused" /> : null}
      {sent ? (
        <Banner
          tone="success"
          title={`Invitation for ${sent.email} as ${sent.role}`}
          testID="invite-sent"
          message={sent.mailed ? 'The link is on its way by e-mail. It works once, for that address only.' : `No e-mail sent: ${sent.reason ?? 'mail is off'}. Send the link yourself.`}
        >
          {sent.link ? (
            <Text variant="label" selectable testID="invite-link">
              {sent.link}
            </Text>
          ) : null}
        </Banner>
      ) : null}
      <FormTextField
        control={control}
        name="email"
        label="E-mail address"
        hint="They sign up or sign in with exactly this address to join."
        autoCapitalize="none"
        autoCorrect={false}
        autoComplete="email"
        inputMode="email"
        testID="invite-email"
        onSubmitEditing={() => void submit()}
      />
      <Controller
        control={control}
        name="role"
        render={({ field }) => (
          <View style={styles.role}>
            <Text variant="label">Role</Text>
            <ChoiceGroup label="Role of the invited person" choices={roleChoices} value={field.value} onChange={field.onChange} testID="invite-role" />
            <Text variant="label" tone="muted">
              {roleSummaries[role]}
            </Text>
          </View>
        )}
      />
      <Button label="Send invitation" onPress={() => void submit()} busy={formState.isSubmitting} testID="invite-submit" style={styles.submit} />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  role: { gap: space.xs },
  submit: { alignSelf: 'flex-start' },
});
