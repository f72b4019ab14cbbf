import { z } from 'zod';

export const PASSWORD_MIN_LENGTH = 10;

export const emailSchema = z
  .string({ required_error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .email('Enter a valid e-mail address, like name@example.com.');

export const signUpSchema = z.object({
  email: emailSchema,
  name: z
    .string({ required_error: 'Enter your name.' })
    .trim()
    .min(1, 'Enter your name.')
    .max(120, 'Keep the name under 120 characters.'),
  password: z
    .string({ required_error: 'Choose a password.' })
    .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters for the password.`)
    .max(200, 'Keep the password under 200 characters.'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password.').max(200),
});
