/** The sign-in form: e-mail and password, field errors beside each field, the server's refusal shown as-is. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { signInSchema, type SignIn } from '../../contracts/auth';
import { meKeys } from '../api/me.queries';
import { space } from '../theme';
import { Banner, Button, FormTextField } from '../ui';
import { authClient, authFailureFrom } from './auth-client';

/** Values put into the form from outside (the demo accounts list); a new object each time. */
export type SignInPrefill = { email: string };

/** On success it refreshes the session query; the signed-out layout then moves the user into the app. */
export function SignInForm({ prefill }: { prefill?: SignInPrefill | null }) {
  const queryClient = useQueryClient();
  const [failure, setFailure] = useState<string | null>(null);
  const { control, handleSubmit, setValue, setError, setFocus, formState } = useForm<SignIn>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  useEffect(() => {
    if (!prefill) return;
    setValue('email', prefill.email, { shouldValidate: true });
  }, [prefill, setValue]);

  const submit = handleSubmit(async (values) => {
    setFailure(null);
    const { error } = await authClient.signIn.email({ email: values.email, password: values.password });
    const refused = authFailureFrom(error);
    if (refused) {
      setFailure(refused.message);
      // Focus would otherwise fall to the page body when the busy button re-renders; keep the user at the field.
      setError('password', { type: 'server', message: 'Not accepted: check the e-mail and password, then try again.' });
      setFocus('password');
      return;
    }
    await queryClient.refetchQueries({ queryKey: meKeys.all });
  });

  return (
    <View style={styles.form}>
      {failure ? <Banner tone="danger" message={failure} testID="sign-in-failure" nativeID="sign-in-failure" /> : null}
      <FormTextField
        control={control}
        name="email"
        label="E-mail"
        autoCapitalize="none"
        autoCorrect={false}
        autoComplete="email"
        inputMode="email"
        testID="sign-in-email"
        onSubmitEditing={() => void submit()}
      />
      <FormTextField
        control={control}
        name="password"
        label="Password"
        secureTextEntry
        autoComplete="current-password"
        testID="sign-in-password"
        describedBy={failure ? 'sign-in-failure' : undefined}
        onSubmitEditing={() => void submit()}
      />
      <Button label="Sign in" onPress={() => void submit()} busy={formState.isSubmitting} testID="sign-in-submit" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
