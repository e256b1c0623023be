/** Shapes of the sign-in and sign-up forms, and the password rules the server's auth config must match. */
import { z } from 'zod';
import { userText } from './text';

/** Password length rules (the server passes these to better-auth as minPasswordLength / maxPasswordLength). */
export const passwordRules = { minLength: 10, maxLength: 128 } as const;

const email = z.string().trim().min(1, 'Enter your e-mail address.').email('Enter an e-mail address like name@example.com.');

/** Sign-in checks only that both fields are filled: the rules for new passwords do not apply to existing ones. */
export const signInSchema = z.object({
  email,
  password: z.string().min(1, 'Enter your password.'),
});
export type SignIn = z.infer<typeof signInSchema>;

export const signUpSchema = z.object({
  name: userText().trim().min(1, 'Enter your name.').max(120, 'Keep the name under 120 characters.'),
  email,
  password: z
    .string()
    .min(passwordRules.minLength, `Use at least ${passwordRules.minLength} characters.`)
    .max(passwordRules.maxLength, `Use at most ${passwordRules.maxLength} characters.`),
});
export type SignUp = z.infer<typeof signUpSchema>;
