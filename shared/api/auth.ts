import { z } from 'zod';
import { ROLES } from '../domain/roles';

export const Email = z.string().trim().toLowerCase().max(254).email('Enter an e-mail address');

export const LoginBody = z.object({
  email: Email,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginBody = z.infer<typeof LoginBody>;

/** Password rules: long enough to resist guessing, not the e-mail, not one repeated character. */
export const NewPassword = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(200, 'At most 200 characters')
  .refine((p) => new Set(p).size >= 4, 'Use at least 4 different characters');

export const ChangePasswordBody = z.object({
  currentPassword: z.string().min(1, 'Enter your current password').max(200),
  newPassword: NewPassword,
});

export const MeResponse = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  yardId: z.string().nullable(),
});
export type Me = z.infer<typeof MeResponse>;
