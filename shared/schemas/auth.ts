import { z } from 'zod';
import { ROLES } from '../roles';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'E-mail address is too long.')
  .pipe(z.email('Enter a valid e-mail address.'));

export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password.').max(200),
});

export const passwordResetRequestSchema = z.object({ email: emailSchema });
export const passwordResetConfirmSchema = z.object({ password: passwordSchema });

export const roleSchema = z.enum(ROLES);

export const invitationCreateSchema = z.object({
  email: emailSchema,
  role: roleSchema,
});

export const invitationAcceptSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120).optional(),
  password: z.string().min(1, 'Enter a password.').max(200),
});

export const memberUpdateSchema = z.object({ role: roleSchema });
export const activeStudioSchema = z.object({ studioId: z.uuid() });
export const studioCreateSchema = z.object({ name: z.string().trim().min(1).max(120) });

export type SignInInput = z.infer<typeof signInSchema>;
