import { z } from 'zod';
import { ROLES } from '../domain/roles';
import { Email, NewPassword } from './auth';
import { Uuid, Version } from './common';

export const CreatePersonBody = z.object({
  email: Email,
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role: z.enum(ROLES, { message: 'Choose a role' }),
  yardId: Uuid.nullable().optional(),
  password: NewPassword,
});
export type CreatePersonBody = z.infer<typeof CreatePersonBody>;

export const UpdatePersonBody = z
  .object({
    version: Version,
    name: z.string().trim().min(1).max(120).optional(),
    role: z.enum(ROLES).optional(),
    active: z.boolean().optional(),
    yardId: Uuid.nullable().optional(),
  })
  .strict();
export type UpdatePersonBody = z.infer<typeof UpdatePersonBody>;

export interface PersonRow {
  id: string;
  email: string;
  name: string;
  role: (typeof ROLES)[number];
  active: boolean;
  yardId: string | null;
  locked: boolean;
  version: number;
}
