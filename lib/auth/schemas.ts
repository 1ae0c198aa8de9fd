import { z } from 'zod';
import { emailAddressSchema } from './email-address';

/** Where to go after signing in: a path on this site only, never another site (no open redirects). */
export const callbackPathSchema = z
  .string()
  .max(500)
  .refine((value) => value.startsWith('/') && !value.startsWith('//') && !value.includes('\\'), 'Not a path on this site')
  .catch('/');

export const signInEmailFormSchema = z.object({
  email: emailAddressSchema,
  csrfToken: z.string().min(1).max(200),
  callbackUrl: callbackPathSchema.optional(),
});

export const demoSignInSchema = z.object({
  email: z.string().max(320),
  callbackUrl: callbackPathSchema.optional(),
});

export const signInPageSearchSchema = z.object({
  error: z.string().max(60).optional().catch(undefined),
  callbackUrl: callbackPathSchema.optional(),
  email: z.string().max(320).optional().catch(undefined),
});

export const updateNameSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name, or the part of it you like to be called.').max(120, 'Keep the name under 120 characters.'),
});
