/** The sign-up form: name, e-mail and a new password, with the password rules shown before the user types. */
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { passwordRules, signUpSchema, type SignUp } from '../../contracts/auth';
import { meKeys } from '../api/me.queries';
import { space } from '../theme';
import { Banner, Button, FormTextField } from '../ui';
import { authClient, authFailureFrom } from './auth-client';

/**
 * The server answers a sign-up the same way whether or not the address already has an account, and does not sign
 * the user in; so the form signs in at once with what was just typed, and nobody types the address and password
 * twice. Only when that sign-in is refused (the address already had an account with another password) does
 * `onDone` run, whose confirmation is worded to fit both cases and points to the sign-in form.
 */
export function SignUpForm({ onDone }: { onDone: () => void }) {
  const queryClient = useQueryClient();
  const [failure, setFailure] = useState<string | null>(null);
  const { control, handleSubmit, formState } = useForm<SignUp>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { name: '', email: '', password: '' },
  });

  const submit = handleSubmit(async (values) => {
    setFailure(null);
    const { error } = await authClient.signUp.email({ name: values.name, email: values.email, password: values.password });
    const refused = authFailureFrom(error);
    if (refused) {
      setFailure(refused.message);
      return;
    }
    const signedIn = await authClient.signIn.email({ email: values.email, password: values.password });
    if (!signedIn.error) {
      // The signed-out layout (or the invitation page) follows the session query into the app.
      await queryClient.refetchQueries({ queryKey: meKeys.all });
      return;
    }
    onDone();
  });

  return (
    <View style={styles.form}>
      {failure ? <Banner tone="danger" message={failure} testID="sign-up-failure" /> : null}
      <FormTextField
        control={control}
        name="name"
        label="Name"
        autoComplete="name"
        testID="sign-up-name"
      />
      <FormTextField
        control={control}
        name="email"
        label="E-mail"
        autoCapitalize="none"
        autoCorrect={false}
        autoComplete="email"
        inputMode="email"
        testID="sign-up-email"
      />
      <FormTextField
        control={control}
        name="password"
        label="Password"
        hint={`${passwordRules.minLength} to ${passwordRules.maxLength} characters. A few unrelated words make a good one.`}
        secureTextEntry
        autoComplete="new-password"
        testID="sign-up-password"
        onSubmitEditing={() => void submit()}
      />
      <Button label="Create account" onPress={() => void submit()} busy={formState.isSubmitting} testID="sign-up-submit" />
    </View>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
