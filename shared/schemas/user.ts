import { z } from 'zod';
import { ROLES } from '../enums';
import { newPasswordSchema } from '../security/passwordRules';
import { lineSchema, listQuerySchema, nameSchema } from './common';

/** A new password: at least 12 characters, not a common password, zxcvbn score 3 or more. */
export const passwordSchema = newPasswordSchema;

export const userCreateSchema = z.object({
  email: z.string({ error: 'is required' }).trim().toLowerCase().email('must be an e-mail address').max(254),
  name: nameSchema,
  role: z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` }),
  password: passwordSchema,
  phone: lineSchema(40).optional().nullable(),
});
export const userUpdateSchema = z.object({
  name: nameSchema.optional(),
  role: z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` }).optional(),
  phone: lineSchema(40).optional().nullable(),
  active: z.boolean().optional(),
});
export const userListQuerySchema = listQuerySchema.extend({
  role: z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` }).optional(),
});

export type UserCreate = z.infer<typeof userCreateSchema>;

export interface UserDto {
  id: number;
  email: string;
  name: string;
  role: (typeof ROLES)[number];
  phone?: string | null;
  active: boolean;
  /** Invited and not yet accepted: no password set, and never active. */
  invited: boolean;
  erased: boolean;
  neighbourhoodIds: number[];
  createdAt: string;
  abilities: { update: boolean; delete: boolean; export: boolean; erase: boolean; invite: boolean };
}
